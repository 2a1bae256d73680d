import { handler } from "@/lib/http/route";
import { resendInvitation } from "@/lib/people/people";
import { parseId } from "@/lib/validation";

/** Sends a fresh invitation link (the previous one stops working). */
export const POST = handler({ permission: "people.manage" }, async (_req, ctx: RouteContext<"/api/people/[id]/invitation">, user) => {
  const id = parseId((await ctx.params).id, "That person");
  return Response.json(await resendInvitation(user, id));
});
