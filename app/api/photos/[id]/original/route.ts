import { handler } from "@/lib/http/route";
import { originalResponse } from "@/lib/photos/http";
import { parseId } from "@/lib/validation";

/** The original exactly as uploaded, through a one-minute presigned GET (302). */
export const GET = handler({ permission: "photos.view" }, async (_req, ctx: RouteContext<"/api/photos/[id]/original">, user) => {
  return originalResponse(user, parseId((await ctx.params).id, "That photo"));
});
