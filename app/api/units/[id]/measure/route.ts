import { ComputeBusy, ComputeTimeout } from "@/lib/compute/pool";
import { DeadlineExceeded } from "@/lib/grading/grade-unit";
import { MEASURE_INLINE_BUDGET_MS, measureQuerySchema, measureSchema } from "@/lib/grading/schemas";
import { latestMeasurement, measureAndStore, requireUnit } from "@/lib/grading/unit-grading";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { enqueueMeasureUnit, measureJobState } from "@/lib/jobs/measure-unit";
import { parseId } from "@/lib/validation";
import { noteInspectionOpened } from "@/lib/recheck/openings";

/**
 * Measures the unit under the latest published rubric, in a compute thread (never on this one).
 * Answers 200 with the stored measurement when it finishes within the time budget; otherwise —
 * or when the threads are busy, or with `{ "mode": "queue" }` — queues a "measure-unit" job and
 * answers 202 with its id: poll GET ?jobId=… for the result. The body is optional.
 */
export const POST = handler({ permission: "regions.edit" }, async (req, ctx: RouteContext<"/api/units/[id]/measure">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await requireUnit(user, unitId);
  const { mode = "auto" } = await parseJson(req, measureSchema, { allowEmpty: true, maxBytes: 1024 });
  if (mode === "auto") {
    try {
      const measurement = await measureAndStore(user, unitId, { budgetMs: MEASURE_INLINE_BUDGET_MS });
      return Response.json({ status: "measured", measurement });
    } catch (err) {
      if (!(err instanceof DeadlineExceeded || err instanceof ComputeBusy || err instanceof ComputeTimeout)) throw err;
    }
  }
  const { jobId } = await enqueueMeasureUnit({ workspaceId: user.workspaceId, unitId, requestedBy: user.id });
  return Response.json(
    {
      status: "queued",
      jobId,
      message: jobId ? "Measuring in the background; the result appears here when it is ready." : "A measurement of this unit is already waiting in the queue.",
    },
    { status: 202 },
  );
});

/** The latest measurement with its staleness; with ?jobId= also the state of a queued measurement. */
export const GET = handler({ permission: "inspection.read" }, async (req, ctx: RouteContext<"/api/units/[id]/measure">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await requireUnit(user, unitId);
  const { jobId } = parseQuery(req, measureQuerySchema);
  const job = jobId ? await measureJobState(jobId) : null;
  const ownJob = job && job.data.workspaceId === user.workspaceId && job.data.unitId === unitId ? { id: job.id, state: job.state, notMeasured: job.notMeasured } : null;
  const measurement = await latestMeasurement(user, unitId);
  await noteInspectionOpened(user, unitId);
  return Response.json({ measurement, job: ownJob });
});
