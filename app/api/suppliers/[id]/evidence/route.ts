import { listEvidenceOfSupplier } from "@/lib/evidence/evidence-packs";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The supplier's evidence packs, newest first, each with its e-mail's state and its claim. */
export const GET = handler({ permission: "evidence.send" }, async (_req, ctx: RouteContext<"/api/suppliers/[id]/evidence">, user) => {
  const supplierId = parseId((await ctx.params).id, "That supplier");
  return Response.json({ packs: await listEvidenceOfSupplier(user, supplierId) });
});
