import { listPartTypes } from "@/db/queries/part-types";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { createPartType } from "@/lib/part-types/part-types";
import { partTypeListQuerySchema, partTypeSchema } from "@/lib/part-types/schemas";

export const GET = handler({ permission: "part-types.read" }, async (req, _ctx, user) => {
  const { active = "all" } = parseQuery(req, partTypeListQuerySchema);
  const partTypes = await listPartTypes({ workspaceId: user.workspaceId, active: active === "all" ? undefined : active === "true" });
  return Response.json({ partTypes });
});

export const POST = handler({ permission: "part-types.edit" }, async (req, _ctx, user) => {
  const input = await parseJson(req, partTypeSchema);
  return Response.json({ partType: await createPartType(user, input) }, { status: 201 });
});
