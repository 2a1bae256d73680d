import { createSetSchema } from "@/lib/calibration/schemas";
import { createSet, listCalibrationSets } from "@/lib/calibration/sets";
import { handler, parseJson } from "@/lib/http/route";

/** Every calibration set of the workspace with how many took and passed it (trainers). */
export const GET = handler({ permission: "calibration.manage" }, async (_req, _ctx, user) => {
  return Response.json({ sets: await listCalibrationSets(user) });
});

/** A new set from 5–50 published gallery items (their keys copied), with pass thresholds (201). */
export const POST = handler({ permission: "calibration.manage" }, async (req, _ctx, user) => {
  return Response.json({ set: await createSet(user, await parseJson(req, createSetSchema)) }, { status: 201 });
});
