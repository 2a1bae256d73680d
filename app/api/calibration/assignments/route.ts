import { listMyAssignments } from "@/lib/calibration/attempts";
import { handler } from "@/lib/http/route";

/** The sets assigned to the signed-in person, soonest due first, with where each attempt stands. */
export const GET = handler({ permission: "calibration.take" }, async (_req, _ctx, user) => {
  return Response.json({ assignments: await listMyAssignments(user) });
});
