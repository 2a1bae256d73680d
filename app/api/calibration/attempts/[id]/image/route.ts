import { z } from "zod";
import { attemptPhotoId } from "@/lib/calibration/attempts";
import { positionSchema } from "@/lib/calibration/schemas";
import { handler, parseQuery } from "@/lib/http/route";
import { derivativeResponse } from "@/lib/photos/http";
import { parseId } from "@/lib/validation";

const imageQuerySchema = z.strictObject({
  position: positionSchema,
  variant: z.enum(["preview", "thumbnail"], { error: 'must be "preview" or "thumbnail"' }).default("preview"),
});

/** The photo of one item of one's attempt (`?position=&variant=`), streamed by its place in the set: its id is never told. */
export const GET = handler({ permission: "calibration.take" }, async (req, ctx: RouteContext<"/api/calibration/attempts/[id]/image">, user) => {
  const attemptId = parseId((await ctx.params).id, "That calibration attempt");
  const { position, variant } = parseQuery(req, imageQuerySchema);
  return derivativeResponse(req, user, await attemptPhotoId(user, attemptId, position), variant, { etag: `${attemptId}-${position}` });
});
