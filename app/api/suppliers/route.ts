import { listSuppliers } from "@/db/queries/suppliers";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { supplierListQuerySchema, supplierSchema } from "@/lib/suppliers/schemas";
import { createSupplier } from "@/lib/suppliers/suppliers";

export const GET = handler({ permission: "suppliers.read" }, async (req, _ctx, user) => {
  const { search } = parseQuery(req, supplierListQuerySchema);
  return Response.json({ suppliers: await listSuppliers({ workspaceId: user.workspaceId, search }) });
});

export const POST = handler({ permission: "suppliers.edit" }, async (req, _ctx, user) => {
  const input = await parseJson(req, supplierSchema);
  return Response.json({ supplier: await createSupplier(user, input) }, { status: 201 });
});
