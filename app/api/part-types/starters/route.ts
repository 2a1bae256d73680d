import { transaction } from "@/db/client";
import { handler, parseJson } from "@/lib/http/route";
import { starterRequestSchema } from "@/lib/part-types/schemas";
import { addStarterPartTypes } from "@/lib/part-types/starters";

/**
 * Adds starter part types (`{ slugs }`), each with a draft example rubric to adapt. Starters the
 * workspace already has (same slug or name) are skipped: 201 lists what was created.
 */
export const POST = handler({ permission: "part-types.edit" }, async (req, _ctx, user) => {
  const { slugs } = await parseJson(req, starterRequestSchema);
  const created = await transaction((tx) => addStarterPartTypes(tx, { workspaceId: user.workspaceId, actorId: user.id, slugs }));
  return Response.json({ created, skipped: slugs.length - created.length }, { status: 201 });
});
