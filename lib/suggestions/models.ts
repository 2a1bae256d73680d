import "server-only";
/** The trainers' view of a workspace's learned-suggestion models (GET /api/suggestion-models). */
import { listModels } from "@/db/queries/suggestions";
import { EVALUATION_IOU, SUGGESTION_RULE } from "@/lib/imaging/learned-eval";
import type { SuggestionModelHistory } from "./dto";
import { FIRST_TRAINING_REGIONS, RETRAIN_AFTER_NEW_REGIONS } from "./training-set";

export async function suggestionModelHistory(workspaceId: string): Promise<SuggestionModelHistory> {
  const models = await listModels(workspaceId);
  return {
    models: models.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() })),
    rules: { iouThreshold: EVALUATION_IOU, suggestion: SUGGESTION_RULE, firstTrainingRegions: FIRST_TRAINING_REGIONS, retrainAfterNewRegions: RETRAIN_AFTER_NEW_REGIONS },
  };
}
