/**
 * The CPU-heavy work that runs in compute threads (lib/compute/pool.ts), one function per kind.
 * Plain data in and out (structured clone). Errors travel back as data, so an AppError keeps its
 * code and sentence and a DeadlineExceeded stays recognisable on the other side.
 */
import { scoreCalibrationSet, type ScoreSetInput } from "@/lib/calibration/score-set";
import { AppError } from "@/lib/errors";
import { measureUnit, type UnitMeasureInput } from "@/lib/grading/grade-unit";
import { DeadlineExceeded } from "@/lib/imaging/deadline";
import { suggestPixelCandidates, type PixelCandidateOptions } from "@/lib/imaging/pixel-candidates";
import { suggestRegions, type RegionModel, type SuggestOptions } from "@/lib/imaging/learned";
import { suggestSurface, type SuggestSurfaceOptions } from "@/lib/imaging/suggest-surface";
import { trainAndJudge, type TrainAndJudgeInput } from "@/lib/suggestions/train-and-judge";

const bufferOf = (bytes: Uint8Array) => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);

export const TASKS = {
  "measure-unit": (input: UnitMeasureInput) => measureUnit(input),
  "suggest-surface": ({ image, options }: { image: Uint8Array; options?: SuggestSurfaceOptions }) => suggestSurface(bufferOf(image), options),
  "pixel-candidates": ({ image, options }: { image: Uint8Array; options?: PixelCandidateOptions }) => suggestPixelCandidates(bufferOf(image), options),
  // Buffers arrive as Uint8Array (structured clone); the learned core checks for Buffers.
  "train-suggestion-model": (input: TrainAndJudgeInput) =>
    trainAndJudge({
      ...input,
      train: input.train.map((e) => ({ ...e, image: bufferOf(e.image) })),
      test: input.test.map((p) => ({ ...p, image: bufferOf(p.image) })),
    }),
  "suggest-learned": ({ model, image, options }: { model: RegionModel; image: Uint8Array; options?: SuggestOptions }) => suggestRegions(model, bufferOf(image), options),
  "score-calibration": (input: ScoreSetInput) => scoreCalibrationSet(input),
};

export type TaskName = keyof typeof TASKS;
export type TaskInput<N extends TaskName> = Parameters<(typeof TASKS)[N]>[0];
export type TaskOutput<N extends TaskName> = Awaited<ReturnType<(typeof TASKS)[N]>>;

export type SerialisedError =
  { kind: "app"; code: AppError["code"]; message: string; fieldErrors?: Record<string, string> } | { kind: "deadline" } | { kind: "other"; message: string; stack?: string };
export type TaskResult<T> = { ok: true; value: T } | { ok: false; error: SerialisedError };

export async function runTask<N extends TaskName>(name: N, input: TaskInput<N>): Promise<TaskResult<TaskOutput<N>>> {
  const task = TASKS[name] as (input: TaskInput<N>) => Promise<TaskOutput<N>>;
  if (!task) return { ok: false, error: { kind: "other", message: `Unknown compute task "${String(name)}".` } };
  try {
    return { ok: true, value: await task(input) };
  } catch (err) {
    return { ok: false, error: serialiseError(err) };
  }
}

export function serialiseError(err: unknown): SerialisedError {
  if (err instanceof AppError) return { kind: "app", code: err.code, message: err.message, fieldErrors: err.fieldErrors };
  if (err instanceof DeadlineExceeded) return { kind: "deadline" };
  return { kind: "other", message: err instanceof Error ? err.message : String(err), stack: err instanceof Error ? err.stack : undefined };
}

export function reviveError(error: SerialisedError): Error {
  if (error.kind === "app") return new AppError(error.code, error.message, { fieldErrors: error.fieldErrors });
  if (error.kind === "deadline") return new DeadlineExceeded();
  const revived = new Error(`Compute task failed: ${error.message}`);
  if (error.stack) revived.stack = error.stack;
  return revived;
}
