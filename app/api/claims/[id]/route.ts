import { updateClaim } from "@/lib/evidence/evidence-packs";
import { claimUpdateSchema } from "@/lib/evidence/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Moves a claim to a status with a note (409 when the claim changed since the form read it). */
export const PATCH = handler({ permission: "evidence.send" }, async (req, ctx: RouteContext<"/api/claims/[id]">, user) => {
  const claimId = parseId((await ctx.params).id, "That claim");
  const update = await parseJson(req, claimUpdateSchema, { maxBytes: 8 * 1024 });
  const claim = await updateClaim(user, claimId, update);
  return Response.json({ claim: { id: claim.id, reference: claim.reference, status: claim.status, note: claim.note, version: claim.version, updatedAt: claim.updatedAt } });
});
