/**
 * Evidence links over HTTP against the test server, its PostgreSQL, object store, worker and the
 * local SMTP inbox (no mocks). The test server's limit is 1 MB (scripts/test.ts), so a lot whose
 * three defective units have noisy photos goes behind a link: the e-mail carries the link and no
 * files; the public page (signed out) shows that pack and its files, which download byte for byte
 * as stored; a tampered, expired or wrong-purpose token and a withdrawn link get a plain refusal;
 * a refused send leaves no object behind.
 */
import { eq } from "drizzle-orm";
import Papa from "papaparse";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { evidencePacks, units } from "@/db/schema";
import { signPublicLink } from "@/lib/reports/public-links";
import { listObjects } from "@/lib/storage/s3";
import { evidenceDraft as draft, evidenceWorld, inspectUnit, lotWithUnits, SCRATCH, until } from "../support/evidence";
import { api, BASE_URL, ok, signIn, type Session } from "../support/http";
import { parsedMessagesTo } from "../support/inbox-parsed";
import { flatText, pdfText } from "../support/pdf-text";
import { testStore } from "../support/photos";

const tag = Date.now().toString(36);
const contact = `evidence-link-${tag}@supplier.example`;
const purchaseRef = `PO-LNK-${tag}`;
let lead: Session;
let foreignLead: Session;
let workspaceId: string;
let lotId: string;
let sent: { evidencePack: { id: string; delivery: string; attachments: { filename: string; bytes: number }[] }; claim: { reference: string } };
let linkUrl: string;

/** A picture of noise: JPEG cannot squeeze it, so three of them pass the test server's 1 MB limit. */
async function noisyPreview(seed: number): Promise<Buffer> {
  const width = 1500;
  const height = 1000;
  const raw = Buffer.alloc(width * height * 3);
  let x = seed * 2654435761;
  for (let i = 0; i < raw.length; i++) {
    x = (x * 1103515245 + 12345) >>> 0;
    raw[i] = x >>> 24;
  }
  return sharp(raw, { raw: { width, height, channels: 3 } })
    .webp({ quality: 90 })
    .toBuffer();
}

const page = async (url: string) => {
  const res = await fetch(url);
  return { status: res.status, html: await res.text() };
};
const fileOf = async (token: string, index: number) => {
  const res = await fetch(`${BASE_URL}/api/evidence-links/${token}?file=${index}`);
  return { status: res.status, type: res.headers.get("content-type"), bytes: Buffer.from(await res.arrayBuffer()) };
};
const tokenOf = (url: string) => url.split("/evidence/")[1];
const storedKeys = async () => {
  const keys: string[] = [];
  for await (const o of listObjects(testStore(), `evidence/${workspaceId}/`)) keys.push(o.key);
  return keys.sort();
};

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  foreignLead = await signIn("lead@quillfen.example");
  const world = await evidenceWorld(lead, await signIn("inspector@vellmoor.example"), { tag, contact, supplierName: `Link Supplier ${tag}` });
  workspaceId = world.owner.workspaceId;
  const lot = await lotWithUnits(world, purchaseRef);
  lotId = lot.lotId;
  for (const [i, unitId] of lot.unitIds.slice(0, 3).entries()) await inspectUnit(world, unitId, `LNK-${tag}-${i + 1}`, [SCRATCH], await noisyPreview(i + 1));
  await ok(api(lead, "POST", `/api/lots/${lotId}/disposition`, { disposition: "return_to_vendor", reason: "Scratches on every sampled unit." }), "decision");
}, 120_000);

describe("evidence links", () => {
  it("the preview says the files go behind a link; sending e-mails the link and no files", async () => {
    const { preview } = await ok(api<{ preview: { delivery: string; text: string; totalBytes: number } }>(lead, "POST", `/api/lots/${lotId}/evidence/preview`, draft()), "preview");
    expect(preview.delivery).toBe("link");
    expect(preview.totalBytes).toBeGreaterThan(1_000_000);
    expect(preview.text).toContain("[the evidence link, made when you send]");
    // The message says where the files are: behind the link, never "attached".
    expect(preview.text).not.toContain("are attached");

    // Sent with the template the lead starts from (the evidence panel's), which names {{files}}.
    const { template } = await ok(api<{ template: { body: string } }>(lead, "GET", `/api/lots/${lotId}/evidence`), "template");
    sent = await ok(api(lead, "POST", `/api/lots/${lotId}/evidence`, draft({ claimRef: `LNK-${tag}`, body: template.body })), "send", 202);
    expect(sent.evidencePack.delivery).toBe("link");
    const message = await until("the link e-mail in the inbox", async () => (await parsedMessagesTo(contact)).find((m) => m.subject.includes(`LNK-${tag}`)));
    expect(message.attachments).toEqual([]);
    const found = message.text.match(/https?:\/\/\S+\/evidence\/\S+/);
    expect(found, message.text).not.toBeNull();
    linkUrl = found![0];
    expect(message.text).not.toContain("are attached");
    expect(message.text).toContain("are too large to attach; they are on a read-only page you can open until");
    // In the default template's place for them, before the sign-off.
    expect(message.text.indexOf(linkUrl)).toBeLessThan(message.text.indexOf("Regards,"));
    expect(linkUrl.startsWith(`${BASE_URL}/evidence/`)).toBe(true);
    // One object per file, named by the pack.
    expect(await storedKeys()).toEqual(sent.evidencePack.attachments.map((_, i) => `evidence/${workspaceId}/${sent.evidencePack.id}/${i}`).sort());
  });

  it("the public page shows the pack signed out, and its files download as stored", async () => {
    const { status, html } = await page(linkUrl);
    expect(status).toBe(200);
    expect(html).toContain('data-testid="evidence-link-ok"');
    expect(html).toContain(purchaseRef);
    expect(html).toContain(`LNK-${tag}`);
    const [pack] = await db().select().from(evidencePacks).where(eq(evidencePacks.id, sent.evidencePack.id));
    const token = tokenOf(linkUrl);
    for (const [i, file] of pack.attachments.entries()) {
      expect(html).toContain(file.filename);
      const got = await fileOf(token, i);
      expect(got.status, file.filename).toBe(200);
      expect(got.bytes.length).toBe(file.bytes);
      expect(got.type).toBe(file.contentType);
    }
    const pdf = await fileOf(token, 0);
    expect(flatText(await pdfText(pdf.bytes))).toContain(purchaseRef);
    const csv = await fileOf(token, pack.attachments.length - 1);
    const rows = Papa.parse<Record<string, string>>(csv.bytes.toString("utf8").replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: true }).data;
    const dbUnits = await db().select().from(units).where(eq(units.lotId, lotId)).orderBy(units.sampleIndex);
    expect(rows.map((r) => r.serial)).toEqual(dbUnits.map((u) => u.serial ?? ""));
    expect((await fileOf(token, pack.attachments.length)).status).toBe(404);
  });

  it("a tampered, expired or wrong-purpose token gets a plain refusal and no file", async () => {
    const token = tokenOf(linkUrl);
    const [body, mac] = token.split(".");
    const tampered = `${body}.${mac[0] === "A" ? "B" : "A"}${mac.slice(1)}`;
    const secret = process.env.NEXTAUTH_SECRET!;
    const expired = signPublicLink("evidence-pack", sent.evidencePack.id, { secret, expiresAt: new Date(Date.now() - 60_000) });
    const certificatePurpose = signPublicLink("certificate", sent.evidencePack.id, { secret, expiresAt: new Date(Date.now() + 86_400_000) });
    for (const [bad, reason, words] of [
      [tampered, "invalid", "This evidence link is not valid"],
      [expired, "expired", "This evidence link has expired"],
      [certificatePurpose, "invalid", "This evidence link is not valid"],
    ] as const) {
      const { status, html } = await page(`${BASE_URL}/evidence/${bad}`);
      expect(status).toBe(200);
      expect(html).toContain(`data-reason="${reason}"`);
      expect(html).toContain(words);
      expect(html).not.toContain(purchaseRef);
      const file = await fileOf(bad, 0);
      expect(file.status).toBe(404);
      expect(JSON.parse(file.bytes.toString()).error.message).toContain(words);
    }
  });

  it("a refused send leaves no object behind; another workspace cannot withdraw; the lead withdraws and the page says so", async () => {
    const before = await storedKeys();
    const taken = await api(lead, "POST", `/api/lots/${lotId}/evidence`, draft({ claimRef: `lnk-${tag}` }));
    expect(taken.status).toBe(409);
    expect(await storedKeys()).toEqual(before);

    const path = `/api/evidence-packs/${sent.evidencePack.id}/revoke`;
    expect((await api(foreignLead, "POST", path, {})).status).toBe(404);
    expect((await page(linkUrl)).html).toContain('data-testid="evidence-link-ok"');
    await ok(api(lead, "POST", path, {}), "withdraw");
    const again = await api<{ error: { message: string } }>(lead, "POST", path, {});
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already withdrawn/);
    const { html } = await page(linkUrl);
    expect(html).toContain('data-reason="revoked"');
    expect(html).toContain("This evidence link was withdrawn by the sender.");
    expect(html).not.toContain(purchaseRef);
    expect((await fileOf(tokenOf(linkUrl), 0)).status).toBe(404);
    const { packs } = await ok(api<{ packs: { id: string; revokedAt: string | null; delivery: string }[] }>(lead, "GET", `/api/lots/${lotId}/evidence`), "lot packs");
    expect(packs.find((p) => p.id === sent.evidencePack.id)).toMatchObject({ delivery: "link", revokedAt: expect.any(String) });
  });
});
