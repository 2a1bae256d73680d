import { handler } from "@/lib/http/route";
import { resendInvitation } from "@/lib/people/people";
import { parseId } from "@/lib/validation";

/** Sends a fresh invitation link (the previous one stops working). */
export const POST = handler({ permission: "people.manage" }, async (_req, ctx: RouteContext<"/api/people/[id]/invitation">, user) => {
  const id = parseId((await ctx.params).id, "That person");
  const { emailSent } = await resendInvitation(user, id);
  return Response.json({ emailSent, message: emailSent ? "A new invitation is on its way." : "The invitation e-mail could not be sent; try again later." });
});
