/** Shapes of the learned-suggestion API that the Bench, the Gallery's Suggestions panel and the server share. */
import type { ClassCounts, TrainingSources } from "@/db/schema/suggestions";
import type { Shape } from "@/lib/geometry/shape";
import type { ClassDecision, Evaluation, SUGGESTION_RULE } from "@/lib/imaging/learned-eval";

export type LearnedGhost = { id: string; role: "defect"; defect: string; shape: Shape; score: number; label: string };
export type LearnedSuggestionResponse = { modelId: string | null; modelVersion: number | null; ghosts: LearnedGhost[]; note: string };

/** One stored model as trainers see it (GET /api/suggestion-models), without the model JSON. */
export type SuggestionModelDto = {
  id: string;
  version: number;
  inUse: boolean;
  classCounts: ClassCounts;
  sources: TrainingSources;
  evaluation: Evaluation;
  suggestable: ClassDecision[];
  decision: string;
  trainingMs: number;
  requestedBy: string | null;
  createdAt: string;
};
export type SuggestionModelHistory = {
  models: SuggestionModelDto[];
  rules: { iouThreshold: number; suggestion: typeof SUGGESTION_RULE; firstTrainingRegions: number; retrainAfterNewRegions: number };
};
/** GET /api/suggestion-models/jobs/:id */
export type TrainingJobDto = { id: string; state: string; outcome: { trained: true; version: number; inUse: boolean; decision: string } | { trained: false; reason: string } | null };
