import { requireUser } from "@/lib/auth/require-user";
import { handler } from "@/lib/http/route";
import { resendInvitation } from "@/lib/people/people";
import { parseId } from "@/lib/validation";

/** Sends a fresh invitation link (the previous one stops working). */
export const POST = handler(async (_req, ctx: RouteContext<"/api/people/[id]/invitation">) => {
  const user = await requireUser({ role: "lead" });
  const id = parseId((await ctx.params).id, "That person");
  return Response.json(await resendInvitation(user, id));
});
