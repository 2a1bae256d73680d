/**
 * Evidence sent while the mail server is down (the local inbox stopped for real, no mocks): the
 * worker's refused attempts leave the e-mail queued with the server's answer, and the lot page's
 * list, the supplier page's list and the Outbox all say "queued, retrying (… attempts so far: …)";
 * once the inbox is back the worker delivers it by itself and all three say "sent, after N
 * attempts" (lib/mail/delivery-text.ts words the state for each). The message arrives once, with
 * its files. The final "failed" state needs the last of 14 retries (lib/jobs/queues.ts), so it is
 * worded by the same function and checked in tests/unit/mail/delivery-text.test.ts.
 */
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, expect, it } from "vitest";
import { db } from "@/db/client";
import { outgoingEmails } from "@/db/schema";
import { deliveryText } from "@/lib/mail/delivery-text";
import { evidenceDraft as draft, evidenceWorld, inspectUnit, lotWithUnits, SCRATCH, until } from "../support/evidence";
import { api, BASE_URL, ok, signIn, type Session } from "../support/http";
import { parsedMessagesTo } from "../support/inbox-parsed";
import { serviceControl } from "../support/services";

type PackState = { claimReference: string; emailStatus: "queued" | "sent" | "failed"; emailError: string | null; emailAttempts: number };

let lead: Session;
let mailDown = false;
const tag = Date.now().toString(36);
const contact = `outage-${tag}@supplier.example`;
let ids: { lotId: string; supplierId: string };

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  const world = await evidenceWorld(lead, await signIn("inspector@vellmoor.example"), { tag, contact, supplierName: `Outage Leverantör ${tag}` });
  const lot = await lotWithUnits(world, `PO-OUT-${tag}`);
  await inspectUnit(world, lot.unitIds[0], `OUT-${tag}-1`, [SCRATCH]);
  await inspectUnit(world, lot.unitIds[1], `OUT-${tag}-2`, []);
  await ok(api(lead, "POST", `/api/lots/${lot.lotId}/disposition`, { disposition: "return_to_vendor", reason: "Scratches over the limit." }), "decision");
  ids = { lotId: lot.lotId, supplierId: world.supplierId };
});

afterAll(async () => {
  if (mailDown) await serviceControl("mail", "start");
});

/** The pack as the lot page, the supplier page and the Outbox show it. */
async function shownState(emailId: string, claimRef: string) {
  const onLot = (await ok(api<{ packs: PackState[] }>(lead, "GET", `/api/lots/${ids.lotId}/evidence`), "lot list")).packs.find((p) => p.claimReference === claimRef);
  const onSupplier = (await ok(api<{ packs: PackState[] }>(lead, "GET", `/api/suppliers/${ids.supplierId}/evidence`), "supplier list")).packs.find((p) => p.claimReference === claimRef);
  const outbox = await (await fetch(`${BASE_URL}/outbox`, { headers: { cookie: lead.cookie } })).text();
  const cell = new RegExp(`data-testid="outbox-status-${emailId}"[^>]*>([^<]*)<`).exec(outbox)?.[1];
  return {
    onLot,
    onSupplier,
    outbox: cell
      ?.replace(/&quot;/g, '"')
      .replace(/&#x27;/g, "'")
      .replace(/&amp;/g, "&"),
  };
}

it("a refused send shows queued with the server's answer on the lot, the supplier and the Outbox, then sent after the retries", { timeout: 120_000 }, async () => {
  await serviceControl("mail", "stop");
  mailDown = true;
  const claimRef = `RMA-OUT-${tag}`;
  const sent = await ok(api<{ email: { id: string; status: string } }>(lead, "POST", `/api/lots/${ids.lotId}/evidence`, draft({ claimRef })), "send", 202);
  expect(sent.email.status).toBe("queued");

  // The worker tries, the inbox refuses: still queued, with the reason and the attempts counted.
  const refused = await until("a refused attempt", async () => {
    const [row] = await db().select().from(outgoingEmails).where(eq(outgoingEmails.id, sent.email.id));
    return row.attempts >= 1 && row.error ? row : undefined;
  });
  expect(refused.status).toBe("queued");
  expect(refused.error).toMatch(/ECONNREFUSED|connect/i);
  const whileDown = await shownState(sent.email.id, claimRef);
  for (const pack of [whileDown.onLot, whileDown.onSupplier]) {
    expect(pack).toMatchObject({ emailStatus: "queued" });
    expect(pack!.emailAttempts).toBeGreaterThanOrEqual(1);
    expect(pack!.emailError).toMatch(/ECONNREFUSED|connect/i);
    expect(deliveryText({ status: pack!.emailStatus, attempts: pack!.emailAttempts, error: pack!.emailError })).toMatch(/^queued, retrying \(\d+ attempts? so far: .*(ECONNREFUSED|connect)/i);
  }
  expect(whileDown.outbox).toMatch(/^queued, retrying \(\d+ attempts? so far: .*(ECONNREFUSED|connect)/i);
  expect(await parsedMessagesTo(contact)).toHaveLength(0);

  // The inbox comes back: the worker's next retry delivers it, nobody resends.
  await serviceControl("mail", "start");
  mailDown = false;
  const delivered = await until(
    "the retried delivery",
    async () => {
      const [row] = await db().select().from(outgoingEmails).where(eq(outgoingEmails.id, sent.email.id));
      return row.status === "sent" ? row : undefined;
    },
    90_000,
  );
  expect(delivered.attempts).toBeGreaterThan(1);
  expect(delivered.error).toBeNull();
  const afterwards = await shownState(sent.email.id, claimRef);
  for (const pack of [afterwards.onLot, afterwards.onSupplier]) expect(pack).toMatchObject({ emailStatus: "sent", emailError: null, emailAttempts: delivered.attempts });
  expect(afterwards.outbox).toBe(`sent, after ${delivered.attempts} attempts`);
  const messages = await until("the message in the inbox", async () => {
    const found = await parsedMessagesTo(contact);
    return found.length ? found : undefined;
  });
  expect(messages).toHaveLength(1);
  expect(messages[0].subject).toContain(claimRef);
  expect(messages[0].attachments.map((a) => a.contentType.split(";")[0]).sort()).toEqual(["application/pdf", "image/jpeg", "text/csv"]);
});
