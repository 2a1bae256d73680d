import { handler, parseJson } from "@/lib/http/route";
import { sendToRecheck } from "@/lib/recheck/recording";
import { sendToRecheckSchema } from "@/lib/recheck/schemas";

/** A lead or an auditor sends a unit's current grade to recheck by hand (201; 409 when it already has one). */
export const POST = handler({ permission: "recheck.perform" }, async (req, _ctx, user) => {
  const input = await parseJson(req, sendToRecheckSchema);
  return Response.json({ recheck: await sendToRecheck(user, input) }, { status: 201 });
});
