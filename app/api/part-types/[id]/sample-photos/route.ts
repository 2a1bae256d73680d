import { z } from "zod";
import { getPartType } from "@/db/queries/part-types";
import { listSamplePhotos } from "@/db/queries/photos";
import { notFound } from "@/lib/errors";
import type { PolygonShape } from "@/lib/geometry/shape";
import { handler, parseQuery } from "@/lib/http/route";
import { unitLabel } from "@/lib/photos/dto";
import { parseId } from "@/lib/validation";

const querySchema = z.strictObject({ view: z.string({ error: "Name the view: ?view=<key>." }).trim().min(1, "Name the view: ?view=<key>.").max(40, "That is not a view key.") });

/**
 * Photos a lead can draw a view's zones on (drawing zones edits the part type): the processed
 * photos of that view of this part type (any unit), each with its Surface outline, so the zones
 * land where grading will put them.
 */
export const GET = handler({ permission: "part-types.edit" }, async (req, ctx: RouteContext<"/api/part-types/[id]/sample-photos">, user) => {
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
