/**
 * The demo's evidence packs and claims: each claimable decided lot of the scenario (rejected, or
 * returned / sorted) got its evidence weeks ago, and the claims stand in different states, so the
 * lot pages, the supplier pages and their scorecards show the follow-up on a first visit.
 *
 * The files are the app's own (lot report PDF and sampled-units CSV from lib/evidence/attachments,
 * the template filled by lib/evidence/template), so the sizes and text are what the app would have
 * sent. The e-mails are recorded as sent at the time; they predate this machine's local inbox, so
 * the Outbox lists them without a stored copy (messageId null).
 */
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { activityLog, claims, evidencePacks, lots, outgoingEmails, suppliers } from "@/db/schema";
import type { ClaimStatus } from "@/lib/evidence/claim-status";
import { evidenceFiles } from "@/lib/evidence/attachments";
import { DEFAULT_EVIDENCE_BODY, DEFAULT_EVIDENCE_SUBJECT, evidenceText, evidenceValues, fillTemplate } from "@/lib/evidence/template";
import { loadLotReport } from "@/lib/reports/lot-report-load";
import type { seedPeople } from "./people";

type People = Awaited<ReturnType<typeof seedPeople>>;

const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/** Which scenario lot, the claim reference the lead typed, and where the claim stands now. */
const PACKS: { purchaseRef: string; claimRef: string | null; status: ClaimStatus; note: string; answeredAfterDays: number }[] = [
  { purchaseRef: "PO-24-0640", claimRef: "RMA-OV-3318", status: "credited", note: "Credit note CN-2291 received for the returned lot.", answeredAfterDays: 9 },
  {
    purchaseRef: "PO-24-0702",
    claimRef: "RMA-OV-3342",
    status: "refused",
    note: "Supplier says the current was read on a different charger; we sent our test set-up, awaiting reply.",
    answeredAfterDays: 6,
  },
  // null: numbered by the app's rule (CLM-<year>-<n>), as when the lead leaves the field empty.
  { purchaseRef: "PO-24-0733", claimRef: null, status: "open", note: "", answeredAfterDays: 0 },
];

/** Runs after seedLots (it reads the decided lots) and before seedPhotos (history lots have no photos). */
export async function seedEvidence(people: People) {
  const ws = people.vellmoor;
  const leadEmail = "lead@vellmoor.example";
  const lead = ws.userIds[leadEmail];
  const reader = { workspaceId: ws.workspaceId, name: "Demo seed", roles: ["lead"] as const };
  const seeded: { purchaseRef: string; claim: string; status: ClaimStatus }[] = [];
  for (const spec of PACKS) {
    const [lot] = await db()
      .select({ id: lots.id, supplierId: lots.supplierId, decidedAt: lots.decidedAt, contact: suppliers.contactEmail })
      .from(lots)
      .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
      .where(and(eq(lots.workspaceId, ws.workspaceId), eq(lots.purchaseRef, spec.purchaseRef), eq(lots.status, "decided")));
    if (!lot?.decidedAt) throw new Error(`Seed evidence: lot ${spec.purchaseRef} is not a decided lot of the scenario`);
    const sentAt = new Date(lot.decidedAt.getTime() + 2 * HOUR);
    const claimRef = spec.claimRef ?? `CLM-${sentAt.getUTCFullYear()}-0001`;
    const report = await loadLotReport(reader, lot.id);
    // The demo's packs were small enough to attach.
    const values = evidenceValues(report, claimRef, { kind: "attached" });
    const subject = fillTemplate(DEFAULT_EVIDENCE_SUBJECT, values);
    const body = evidenceText(DEFAULT_EVIDENCE_BODY, values, { kind: "attached" });
    const files = await evidenceFiles(report, { timeZone: "UTC" });
    const answeredAt = new Date(sentAt.getTime() + spec.answeredAfterDays * DAY);
    await db().transaction(async (tx) => {
      const [email] = await tx
        .insert(outgoingEmails)
        .values({ workspaceId: ws.workspaceId, kind: "supplier_evidence", toAddress: lot.contact, subject, status: "sent", attempts: 1, createdAt: sentAt, updatedAt: sentAt })
        .returning();
      const packId = randomUUID();
      await tx.insert(evidencePacks).values({
        id: packId,
        workspaceId: ws.workspaceId,
        lotId: lot.id,
        supplierId: lot.supplierId,
        emailId: email.id,
        toAddress: lot.contact,
        subject,
        body,
        attachments: files.map(({ filename, contentType, bytes }) => ({ filename, contentType, bytes })),
        delivery: "attached",
        createdBy: lead,
        createdAt: sentAt,
      });
      const moved = spec.status !== "open";
      const [claim] = await tx
        .insert(claims)
        .values({
          workspaceId: ws.workspaceId,
          evidencePackId: packId,
          supplierId: lot.supplierId,
          lotId: lot.id,
          reference: claimRef,
          status: spec.status,
          note: spec.note,
          version: moved ? 2 : 1,
          updatedBy: lead,
          createdAt: sentAt,
          updatedAt: moved ? answeredAt : sentAt,
        })
        .returning();
      await tx.insert(activityLog).values({
        workspaceId: ws.workspaceId,
        actorId: lead,
        action: "evidence.sent",
        subjectType: "lot",
        subjectId: lot.id,
        detail: { demo: true, evidencePackId: packId, claimId: claim.id, claimRef, to: lot.contact },
        createdAt: sentAt,
      });
      if (moved)
        await tx.insert(activityLog).values({
          workspaceId: ws.workspaceId,
          actorId: lead,
          action: "claim.updated",
          subjectType: "lot",
          subjectId: lot.id,
          detail: { demo: true, claimId: claim.id, status: spec.status, note: spec.note },
          createdAt: answeredAt,
        });
    });
    seeded.push({ purchaseRef: spec.purchaseRef, claim: claimRef, status: spec.status });
  }
  return seeded;
}
