/**
 * The compute pool (lib/compute/pool.ts) runs the app's own TypeScript in worker threads: the
 * same results as in-process, errors that keep their meaning across the thread boundary, a soft
 * deadline inside the work, a hard time limit that ends the task, and a per-kind cap on tasks
 * at once.
 */
import sharp from "sharp";
import { afterAll, describe, expect, it } from "vitest";
import { closeCompute, ComputeBusy, ComputeTimeout, runInThread } from "@/lib/compute/pool";
import { AppError } from "@/lib/errors";
import { DeadlineExceeded, measureUnit, type GradingPartTypeInput, type UnitMeasureInput } from "@/lib/grading/grade-unit";

const partType: GradingPartTypeInput = {
  views: [
    {
      key: "lens",
      label: "Lens",
      required: true,
      zones: [
        {
          id: "lens-window",
          label: "lens window",
          polygon: [
            [0, 0],
            [0.5, 0],
            [0.5, 1],
            [0, 1],
          ],
        },
      ],
    },
  ],
  defectClasses: [{ key: "scratch", label: "scratch", severity: "major" }],
  nominalSizeMm: { width: 20, height: 10 },
  panelResolution: null,
};
const input = (defects: UnitMeasureInput["photos"][number]["defects"], extra: Partial<UnitMeasureInput> = {}): UnitMeasureInput => ({
  partType,
  rubric: { rules: [{ id: "lens-scratch-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" }] },
  photos: [
    {
      photoId: "p1",
      viewKey: "lens",
      width: 300,
      height: 200,
      regionsVersion: 1,
      defects,
      surfaces: [
        {
          kind: "polygon",
          points: [
            [50, 50],
            [250, 50],
            [250, 150],
            [50, 150],
          ],
        },
      ],
      rulers: [],
    },
  ],
  functionalFailures: { critical: 0, major: 0, minor: 0 },
  ...extra,
});
const scratch = [{ id: "s1", defect: "scratch", shape: { kind: "rect" as const, x: 60, y: 60, width: 12, height: 10 } }];

afterAll(() => closeCompute());

describe("runInThread", () => {
  it("measures a unit in a thread exactly as in this process", async () => {
    const inThread = await runInThread("measure-unit", input(scratch));
    expect(inThread).toEqual(await measureUnit(input(scratch)));
    expect(inThread.unit.proposal.grade).toBe("B");
  }, 60_000);

  it("brings an AppError back with its code and sentence, naming the photo", async () => {
    const empty = runInThread("measure-unit", { ...input([]), photos: [] });
    await expect(empty).rejects.toBeInstanceOf(AppError);
    await expect(empty).rejects.toMatchObject({ code: "conflict", message: expect.stringMatching(/has no photos yet/) });
    // A Line stored wider than today's cap (16 px on a 300 px photo) is refused, not measured.
    const wide = runInThread(
      "measure-unit",
      input([
        {
          id: "w",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [60, 60],
              [200, 60],
            ],
            width: 150,
          },
        },
      ]),
    );
    await expect(wide).rejects.toMatchObject({ code: "conflict", message: expect.stringMatching(/^Photo 1 \(Lens\) cannot be measured: .*must be at most 16 px/) });
  }, 60_000);

  it("stops at the soft deadline with DeadlineExceeded", async () => {
    await expect(runInThread("measure-unit", input(scratch, { deadline: Date.now() - 1 }))).rejects.toBeInstanceOf(DeadlineExceeded);
  }, 60_000);

  it("ends a task past its hard limit (ComputeTimeout) and keeps serving afterwards", async () => {
    const noise = await sharp({ create: { width: 3000, height: 2000, channels: 3, background: "#808080", noise: { type: "gaussian", mean: 128, sigma: 40 } } })
      .jpeg()
      .toBuffer();
    const late = runInThread("pixel-candidates", { image: noise }, { timeoutMs: 50 });
    await expect(late).rejects.toBeInstanceOf(ComputeTimeout);
    await expect(late).rejects.toThrow(/Looking for pixel faults took longer than 0 s and was stopped\. Mark them by hand, or try again\./);
    expect((await runInThread("measure-unit", input(scratch))).unit.proposal.grade).toBe("B");
  }, 60_000);

  it("refuses a second task of a kind capped at one at once, without queueing it", async () => {
    const image = await sharp({ create: { width: 600, height: 400, channels: 3, background: "#202020" } })
      .png()
      .toBuffer();
    const first = runInThread("pixel-candidates", { image });
    await expect(runInThread("pixel-candidates", { image })).rejects.toBeInstanceOf(ComputeBusy);
    await expect(first).resolves.toMatchObject({ candidates: expect.any(Array) });
  }, 60_000);
});
