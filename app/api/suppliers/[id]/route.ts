import { getSupplier } from "@/db/queries/suppliers";
import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { supplierUpdateSchema } from "@/lib/suppliers/schemas";
import { updateSupplier } from "@/lib/suppliers/suppliers";
import { parseId } from "@/lib/validation";

export const GET = handler({ permission: "suppliers.read" }, async (_req, ctx: RouteContext<"/api/suppliers/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That supplier");
  const supplier = await getSupplier({ workspaceId: user.workspaceId, supplierId: id });
  if (!supplier) throw notFound("That supplier");
  return Response.json({ supplier });
});

export const PATCH = handler({ permission: "suppliers.edit" }, async (req, ctx: RouteContext<"/api/suppliers/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That supplier");
  const input = await parseJson(req, supplierUpdateSchema);
  return Response.json({ supplier: await updateSupplier(user, id, input) });
});
