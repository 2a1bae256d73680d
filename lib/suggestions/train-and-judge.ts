/**
 * The CPU-heavy half of a training run, pure and free of server imports so it runs in a compute
 * thread (lib/compute/tasks.ts): train on the training photos, then judge the new model and the
 * one in use on the same held-out photos (lib/imaging/learned-eval.ts) and decide whether the new
 * one is switched in. Nothing here chooses the photos: the caller has already split them by photo
 * (a photo is never on both sides).
 */
import { trainRegionModel, type RegionModel, type TrainingExample, type TrainingOptions } from "@/lib/imaging/learned";
import { compareModels, evaluateRegionModel, suggestableClasses, type ModelStanding, type TestPhoto } from "@/lib/imaging/learned-eval";

export type TrainAndJudgeInput = { train: TrainingExample[]; test: TestPhoto[]; current: RegionModel | null; options?: TrainingOptions };
export type TrainAndJudgeOutput = {
  model: RegionModel;
  candidate: ModelStanding;
  /** The model in use, judged again on the same test photos (null: none in use). */
  current: ModelStanding | null;
  switchIn: boolean;
  decision: string;
  trainingMs: number;
};

export async function trainAndJudge({ train, test, current, options }: TrainAndJudgeInput): Promise<TrainAndJudgeOutput> {
  const started = performance.now();
  const model = await trainRegionModel(train, options);
  const trainingMs = Math.round(performance.now() - started);
  const evaluation = await evaluateRegionModel(model, test);
  const candidate: ModelStanding = { evaluation, suggestable: suggestableClasses(model, evaluation) };
  let currentStanding: ModelStanding | null = null;
  if (current) {
    const currentEvaluation = await evaluateRegionModel(current, test);
    currentStanding = { evaluation: currentEvaluation, suggestable: suggestableClasses(current, currentEvaluation) };
  }
  const { switchIn, reason } = compareModels(candidate, currentStanding);
  return { model, candidate, current: currentStanding, switchIn, decision: reason, trainingMs };
}
