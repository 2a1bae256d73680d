/**
 * Evidence packs and claims over HTTP against the test server, its PostgreSQL, its worker and the
 * local SMTP inbox (no mocks): a lead previews and sends evidence about a returned lot; the worker
 * delivers it; the message read back with mailparser carries the lot report PDF (text via pdf.js,
 * checked against the database), the annotated photo (a JPEG, read by sharp) and the CSV of the
 * sampled units (parsed with papaparse, row by row against the database). The claim opens on the
 * supplier and moves with a note. Bad input and an undecided lot send and store nothing.
 */
import { and, desc, eq } from "drizzle-orm";
import Papa from "papaparse";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { claims, evidencePacks, grades, outgoingEmails, units } from "@/db/schema";
import { evidenceDraft as draft, evidenceWorld, inspectUnit, lotWithUnits, SCRATCH, until } from "../support/evidence";
import { api, BASE_URL, ok, signIn, type Session } from "../support/http";
import { parsedMessagesTo } from "../support/inbox-parsed";
import { flatText, pdfText } from "../support/pdf-text";

const REASON = "Scratched housings far over the contract's limit.";

let lead: Session;
let foreignLead: Session;
const tag = Date.now().toString(36);
const contact = `evidence-${tag}@supplier.example`;
let ids: { lotId: string; openLotId: string; supplierId: string; purchaseRef: string; unitIds: string[] };

const countRows = async () => ({
  packs: (await db().select({ id: evidencePacks.id }).from(evidencePacks).where(eq(evidencePacks.supplierId, ids.supplierId))).length,
  emails: (await db().select({ id: outgoingEmails.id }).from(outgoingEmails).where(eq(outgoingEmails.toAddress, contact))).length,
  mail: (await parsedMessagesTo(contact)).length,
});

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  foreignLead = await signIn("lead@quillfen.example");
  const world = await evidenceWorld(lead, await signIn("inspector@vellmoor.example"), { tag, contact, supplierName: `Evidence Dodavatel Ořech ${tag}` });
  const purchaseRef = `PO-EVD-${tag}`;
  const decided = await lotWithUnits(world, purchaseRef);
  await inspectUnit(world, decided.unitIds[0], `EVD-${tag}-1`, [SCRATCH]);
  await inspectUnit(world, decided.unitIds[1], `EVD-${tag}-2`, []);
  await inspectUnit(world, decided.unitIds[2], `EVD-${tag}-3`, []);
  await ok(api(lead, "POST", `/api/lots/${decided.lotId}/disposition`, { disposition: "return_to_vendor", reason: REASON }), "decision");
  const open = await lotWithUnits(world, `PO-EVD-OPEN-${tag}`);
  ids = { lotId: decided.lotId, openLotId: open.lotId, supplierId: world.supplierId, purchaseRef, unitIds: decided.unitIds };
});

describe("evidence packs", () => {
  it("the preview fills the template and lists the files; nothing is stored or sent", async () => {
    const before = await countRows();
    const { preview } = await ok(
      api<{ preview: { to: string; subject: string; text: string; claimRef: string; delivery: string; attachments: { filename: string; bytes: number }[] } }>(
        lead,
        "POST",
        `/api/lots/${ids.lotId}/evidence/preview`,
        draft(),
      ),
      "preview",
    );
    expect(preview.to).toBe(contact);
    expect(preview.claimRef).toMatch(/^CLM-\d{4}-\d{4}$/);
    expect(preview.subject).toBe(`Lot ${ids.purchaseRef}: rejected — return to vendor (claim ${preview.claimRef})`);
    expect(preview.text).toContain(`Reason: ${REASON}`);
    expect(preview.delivery).toBe("attached");
    expect(preview.attachments.map((a) => a.filename)).toEqual([`lot-report-PO-EVD-${tag}.pdf`, `photo-01-Unit_EVD-${tag}-1_Back_grade_C.jpg`, `sampled-units-PO-EVD-${tag}.csv`]);
    expect(await countRows()).toEqual(before);
  });

  it("sending queues the e-mail; the worker delivers it with the PDF, the annotated photo and the CSV; the claim opens on the supplier", async () => {
    const sent = await ok(
      api<{ evidencePack: { id: string }; claim: { id: string; reference: string; status: string }; email: { id: string; status: string } }>(
        lead,
        "POST",
        `/api/lots/${ids.lotId}/evidence`,
        // The template the lead starts from (the evidence panel's), which names {{files}}.
        draft({ claimRef: `RMA-${tag}`, body: (await ok(api<{ template: { body: string } }>(lead, "GET", `/api/lots/${ids.lotId}/evidence`), "template")).template.body }),
      ),
      "send",
      202,
    );
    expect(sent.claim).toMatchObject({ reference: `RMA-${tag}`, status: "open" });
    const email = await until("the worker to deliver the evidence", async () => {
      const [row] = await db().select().from(outgoingEmails).where(eq(outgoingEmails.id, sent.email.id));
      return row.status === "sent" ? row : undefined;
    });
    expect(email.kind).toBe("supplier_evidence");
    const message = await until("the message in the inbox", async () => (await parsedMessagesTo(contact)).find((m) => m.subject.includes(`RMA-${tag}`)));
    // The message says the files are attached (they are), and nothing of a link.
    expect(message.text).toContain("and a table of the sampled units are attached.");
    expect(message.text).not.toMatch(/evidence link|too large/);
    const byType = (type: string) => message.attachments.filter((a) => a.contentType.startsWith(type));
    const [pdf] = byType("application/pdf");
    const text = flatText(await pdfText(pdf.content));
    expect(text).toContain(ids.purchaseRef);
    expect(text).toContain(REASON);
    const [photo] = byType("image/jpeg");
    expect((await sharp(photo.content).metadata()).format).toBe("jpeg");
    const [csvFile] = byType("text/csv");
    const parsed = Papa.parse<Record<string, string>>(csvFile.content.toString("utf8").replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const dbUnits = await db().select().from(units).where(eq(units.lotId, ids.lotId)).orderBy(units.sampleIndex);
    expect(parsed.data.map((r) => r.serial)).toEqual(dbUnits.map((u) => u.serial ?? ""));
    for (const [i, unit] of dbUnits.entries()) {
      const [current] = await db().select().from(grades).where(eq(grades.unitId, unit.id)).orderBy(desc(grades.createdAt), desc(grades.id)).limit(1);
      expect(parsed.data[i].grade).toBe(current?.finalGrade ?? "");
    }
    // The stored pack says what was sent, sizes included.
    const [pack] = await db().select().from(evidencePacks).where(eq(evidencePacks.id, sent.evidencePack.id));
    expect(pack.attachments.map((a) => a.bytes).sort()).toEqual(message.attachments.map((a) => a.size).sort());

    const { packs } = await ok(api<{ packs: { claimReference: string; claimStatus: string; emailStatus: string }[] }>(lead, "GET", `/api/suppliers/${ids.supplierId}/evidence`), "supplier list");
    expect(packs.find((p) => p.claimReference === `RMA-${tag}`)).toMatchObject({ claimStatus: "open", emailStatus: "sent" });
    // The supplier page's scorecard lists the open claim and the part type's switching state.
    const page = await fetch(`${BASE_URL}/suppliers/${ids.supplierId}`, { headers: { cookie: lead.cookie } });
    const html = await page.text();
    const openClaims = html.slice(html.indexOf('data-testid="scorecard-open-claims"'));
    expect(openClaims).toContain(`RMA-${tag}`);
    const switching = html.slice(html.indexOf('data-testid="scorecard-switching"'), html.indexOf('data-testid="scorecard-open-claims"'));
    expect(switching).toContain(`Evidence part ${tag}`);
  });

  it("a claim moves with a note; an unknown status or a stale version is refused and changes nothing", async () => {
    const sent = await ok(api<{ claim: { id: string; version: number } }>(lead, "POST", `/api/lots/${ids.lotId}/evidence`, draft()), "send", 202);
    const unknown = await api<{ error: { message: string } }>(lead, "PATCH", `/api/claims/${sent.claim.id}`, { status: "paid", note: "", version: sent.claim.version });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/Choose a claim status: open, credited, replaced, refused, closed/);
    const moved = await ok(
      api<{ claim: { status: string; note: string; version: number } }>(lead, "PATCH", `/api/claims/${sent.claim.id}`, {
        status: "credited",
        note: "Credit note 118 received.",
        version: sent.claim.version,
      }),
      "credit",
    );
    expect(moved.claim).toMatchObject({ status: "credited", note: "Credit note 118 received." });
    const stale = await api(lead, "PATCH", `/api/claims/${sent.claim.id}`, { status: "refused", note: "", version: sent.claim.version });
    expect(stale.status).toBe(409);
    const [row] = await db().select().from(claims).where(eq(claims.id, sent.claim.id));
    expect(row).toMatchObject({ status: "credited", version: moved.claim.version });
  });

  it("bad input, an undecided lot and another workspace get a clear 4xx and nothing is stored or sent", async () => {
    // The worker may still be delivering the previous test's pack: count once the inbox has caught up.
    const before = await until("earlier evidence delivered", async () => {
      const rows = await countRows();
      return rows.mail === rows.emails ? rows : undefined;
    });
    const long = await api<{ error: { message: string } }>(lead, "POST", `/api/lots/${ids.lotId}/evidence`, draft({ body: "x".repeat(5001) }));
    expect(long.status).toBe(400);
    expect(long.body.error.message).toMatch(/Keep the message under 5000 characters/);
    const unknown = await api<{ error: { message: string } }>(lead, "POST", `/api/lots/${ids.lotId}/evidence`, draft({ body: "Dear {{contactName}}" }));
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/names \{\{contactName\}\}, which is not a placeholder/);
    const open = await api<{ error: { message: string } }>(lead, "POST", `/api/lots/${ids.openLotId}/evidence`, draft());
    expect(open.status).toBe(409);
    expect(open.body.error.message).toMatch(/not decided yet/);
    expect((await api(lead, "POST", `/api/lots/${ids.openLotId}/evidence/preview`, draft())).status).toBe(409);
    const taken = await api<{ error: { message: string } }>(lead, "POST", `/api/lots/${ids.lotId}/evidence`, draft({ claimRef: `rma-${tag}` }));
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toMatch(/already used/);
    for (const [method, path] of [
      ["GET", `/api/lots/${ids.lotId}/evidence`],
      ["POST", `/api/lots/${ids.lotId}/evidence`],
      ["POST", `/api/lots/${ids.lotId}/evidence/preview`],
      ["GET", `/api/suppliers/${ids.supplierId}/evidence`],
    ] as const) {
      expect((await api(foreignLead, method, path, method === "POST" ? draft() : undefined)).status, `${method} ${path}`).toBe(404);
    }
    const [anyClaim] = await db()
      .select()
      .from(claims)
      .where(and(eq(claims.supplierId, ids.supplierId)));
    expect((await api(foreignLead, "PATCH", `/api/claims/${anyClaim.id}`, { status: "closed", note: "", version: anyClaim.version })).status).toBe(404);
    expect(await countRows()).toEqual(before);
  });

  it("an app-numbered claim follows the highest CLM number, typed ones included, and two sent at once get different numbers", async () => {
    const prefix = `CLM-${new Date().getUTCFullYear()}-`;
    // A reference a lead typed in the app's own form, far above anything numbered so far.
    const typed = 800_000 + Math.floor(Math.random() * 100_000);
    await ok(api(lead, "POST", `/api/lots/${ids.lotId}/evidence`, draft({ claimRef: `${prefix}${typed}` })), "typed", 202);
    const { preview } = await ok(api<{ preview: { claimRef: string } }>(lead, "POST", `/api/lots/${ids.lotId}/evidence/preview`, draft()), "preview");
    expect(preview.claimRef.startsWith(prefix)).toBe(true);
    // Another file's pack may take the next number meanwhile; a count of claims would be far below.
    expect(Number(preview.claimRef.slice(prefix.length))).toBeGreaterThan(typed);

    const both = await Promise.all([1, 2].map(() => api<{ claim: { reference: string } }>(lead, "POST", `/api/lots/${ids.lotId}/evidence`, draft())));
    expect(both.map((r) => r.status)).toEqual([202, 202]);
    const [a, b] = both.map((r) => r.body.claim.reference);
    expect(a).not.toBe(b);
    for (const ref of [a, b]) expect(Number(ref.slice(prefix.length))).toBeGreaterThan(typed);
  });
});
