import { listEvidenceOfLot, sendEvidence } from "@/lib/evidence/evidence-packs";
import { evidenceDraftSchema } from "@/lib/evidence/schemas";
import { DEFAULT_EVIDENCE_BODY, DEFAULT_EVIDENCE_SUBJECT, EVIDENCE_PLACEHOLDERS } from "@/lib/evidence/template";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The lot's evidence packs with their e-mail's delivery state and claim, and the default template. */
export const GET = handler({ permission: "evidence.send" }, async (_req, ctx: RouteContext<"/api/lots/[id]/evidence">, user) => {
  const lotId = parseId((await ctx.params).id, "That lot");
  const { packs, refusal } = await listEvidenceOfLot(user, lotId);
  return Response.json({ packs, refusal, template: { subject: DEFAULT_EVIDENCE_SUBJECT, body: DEFAULT_EVIDENCE_BODY, placeholders: EVIDENCE_PLACEHOLDERS } });
});

/** Sends the evidence pack through the mail queue and opens its claim (202: the worker delivers it). */
export const POST = handler({ permission: "evidence.send" }, async (req, ctx: RouteContext<"/api/lots/[id]/evidence">, user) => {
  const lotId = parseId((await ctx.params).id, "That lot");
  const draft = await parseJson(req, evidenceDraftSchema, { maxBytes: 32 * 1024 });
  const { pack, claim, email } = await sendEvidence(user, lotId, draft);
  return Response.json(
    {
      evidencePack: { id: pack.id, delivery: pack.delivery, attachments: pack.attachments },
      claim: { id: claim.id, reference: claim.reference, status: claim.status, version: claim.version },
      email: { id: email.id, status: email.status },
    },
    { status: 202 },
  );
});
