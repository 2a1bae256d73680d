import { z } from "zod";
import { getPartType, listSamplePhotos } from "@/db/queries/part-types";
import { requireUser } from "@/lib/auth/require-user";
import { notFound } from "@/lib/errors";
import { handler, parseQuery } from "@/lib/http/route";
import { unitLabel } from "@/lib/photos/queries";
import type { PolygonShape } from "@/lib/geometry/shape";
import { parseId } from "@/lib/validation";

const querySchema = z.strictObject({ view: z.string({ error: "Name the view: ?view=<key>." }).trim().min(1, "Name the view: ?view=<key>.").max(40, "That is not a view key.") });

/**
 * Photos a lead can draw a view's zones on: the newest processed photos of that view of this part
 * type (any unit), each with its Surface outline, so the zones land where grading will put them.
 */
export const GET = handler(async (req, ctx: RouteContext<"/api/part-types/[id]/sample-photos">) => {
  const user = await requireUser({ role: "lead" });
  const partTypeId = parseId((await ctx.params).id, "That part type");
  const { view } = parseQuery(req, querySchema);
  const partType = await getPartType({ workspaceId: user.workspaceId, partTypeId });
  if (!partType) throw notFound("That part type");
  const rows = await listSamplePhotos({ workspaceId: user.workspaceId, partTypeId, viewKey: view });
  return Response.json({
    photos: rows.map((p) => ({
      id: p.id,
      unitLabel: unitLabel(p),
      width: p.width,
      height: p.height,
      preview: p.previewWidth && p.previewHeight ? { width: p.previewWidth, height: p.previewHeight } : null,
      takenAt: p.createdAt,
      surfaces: p.surfaces.filter((s): s is { id: string; shape: PolygonShape } => s.shape?.kind === "polygon"),
      urls: { preview: `/api/photos/${p.id}/preview` },
    })),
  });
});
