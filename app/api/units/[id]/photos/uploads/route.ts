import { handler, parseJson } from "@/lib/http/route";
import { answeringRejections } from "@/lib/photos/http";
import { createUploadIntent, loadUnit } from "@/lib/photos/intents";
import { uploadIntentSchema } from "@/lib/photos/schemas";
import { parseId } from "@/lib/validation";

/** Step 1 of an upload: a presigned PUT URL for one file and the ticket that finalises it. */
export const POST = handler({ permission: "photos.capture" }, async (req, ctx: RouteContext<"/api/units/[id]/photos/uploads">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await loadUnit(user, unitId);
  const input = await parseJson(req, uploadIntentSchema);
  return answeringRejections(async () => Response.json(await createUploadIntent(user, unitId, input), { status: 201 }));
});
