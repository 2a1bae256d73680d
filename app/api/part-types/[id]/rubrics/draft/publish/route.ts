import { requireUser } from "@/lib/auth/require-user";
import { publishDraft } from "@/lib/grading/rubric-versions";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Publishes the draft as the part type's grading rubric. Leads only; the version is frozen. */
export const POST = handler(async (_req, ctx: RouteContext<"/api/part-types/[id]/rubrics/draft/publish">) => {
  const user = await requireUser({ role: "lead" });
  const partTypeId = parseId((await ctx.params).id, "That part type");
  return Response.json(await publishDraft(user, partTypeId));
});
