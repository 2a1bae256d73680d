import { getSupplier } from "@/db/queries/suppliers";
import { requireUser } from "@/lib/auth/require-user";
import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { supplierUpdateSchema } from "@/lib/suppliers/schemas";
import { updateSupplier } from "@/lib/suppliers/suppliers";
import { parseId } from "@/lib/validation";

export const GET = handler(async (_req, ctx: RouteContext<"/api/suppliers/[id]">) => {
  const user = await requireUser();
  const id = parseId((await ctx.params).id, "That supplier");
  const supplier = await getSupplier({ workspaceId: user.workspaceId, supplierId: id });
  if (!supplier) throw notFound("That supplier");
  return Response.json({ supplier });
});

export const PATCH = handler(async (req, ctx: RouteContext<"/api/suppliers/[id]">) => {
  const user = await requireUser({ role: "lead" });
  const id = parseId((await ctx.params).id, "That supplier");
  const input = await parseJson(req, supplierUpdateSchema);
  return Response.json({ supplier: await updateSupplier(user, id, input) });
});
