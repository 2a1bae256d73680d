/**
 * Fixture ids for the evidence routes in the access matrix: a pack sent by evidence link (with its
 * claim and its Outbox row) about the fixture lot, written straight to the database — the access
 * matrix checks who may act on it, evidence.test.ts and evidence-link.test.ts send real ones.
 */
import { randomUUID } from "node:crypto";
import { db } from "@/db/client";
import { claims, evidencePacks, outgoingEmails } from "@/db/schema";
import { workspaceIdOf } from "./grading";
import type { Session } from "./http";

export async function evidenceFixtureIds(lead: Session, { lotId, supplierId }: { lotId: string; supplierId: string }): Promise<Record<string, string>> {
  const { workspaceId, userId } = await workspaceIdOf(lead.email);
  const to = "fixture@supplier.example";
  const [email] = await db().insert(outgoingEmails).values({ workspaceId, kind: "supplier_evidence", toAddress: to, subject: "Fixture evidence", status: "sent" }).returning();
  const packId = randomUUID();
  await db()
    .insert(evidencePacks)
    .values({
      id: packId,
      workspaceId,
      lotId,
      supplierId,
      emailId: email.id,
      toAddress: to,
      subject: "Fixture evidence",
      body: "Fixture.",
      attachments: [],
      delivery: "link",
      linkExpiresAt: new Date(Date.now() + 86_400_000),
      createdBy: userId,
    });
  const [claim] = await db()
    .insert(claims)
    .values({ workspaceId, evidencePackId: packId, supplierId, lotId, reference: `FX-${packId.slice(0, 8)}`, updatedBy: userId })
    .returning();
  // Not a signed token: the public file route answers anyone with the plain refusal.
  return { evidencePackId: packId, claimId: claim.id, evidenceLinkToken: "not-a-signed-token" };
}
