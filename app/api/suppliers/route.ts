import { listSuppliers } from "@/db/queries/suppliers";
import { requireUser } from "@/lib/auth/require-user";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { supplierListQuerySchema, supplierSchema } from "@/lib/suppliers/schemas";
import { createSupplier } from "@/lib/suppliers/suppliers";

export const GET = handler(async (req) => {
  const user = await requireUser();
  const { search } = parseQuery(req, supplierListQuerySchema);
  return Response.json({ suppliers: await listSuppliers({ workspaceId: user.workspaceId, search }) });
});

export const POST = handler(async (req) => {
  const user = await requireUser({ role: "lead" });
  const input = await parseJson(req, supplierSchema);
  return Response.json({ supplier: await createSupplier(user, input) }, { status: 201 });
});
