import { handler } from "@/lib/http/route";
import { derivativeResponse } from "@/lib/photos/http";
import { parseId } from "@/lib/validation";

/** The upright, metadata-free WebP thumbnail, streamed from the store after the access check. */
export const GET = handler({ permission: "photos.view" }, async (req, ctx: RouteContext<"/api/photos/[id]/thumbnail">, user) => {
  return derivativeResponse(req, user, parseId((await ctx.params).id, "That photo"), "thumbnail");
});
