import { measureGalleryItem } from "@/lib/gallery/measure";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The item's measured numbers and what the current published rubric says (null while its photo is not ready). */
export const GET = handler({ permission: "gallery.read" }, async (_req, ctx: RouteContext<"/api/gallery/[id]/measurement">, user) => {
  return Response.json({ measurement: await measureGalleryItem(user, parseId((await ctx.params).id, "That gallery item")) });
});
