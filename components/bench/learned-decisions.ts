/**
 * What the Bench records when the inspector accepts or dismisses learned ghosts: one request per
 * model that made them (normally one). An accepted ghost counts as accepted even when the canvas
 * left it out because the same defect was already marked there: the inspector agreed it is one.
 * Pure, so the grouping is unit-tested without a browser.
 */
import type { GhostShape } from "@/components/annotate/types";
import type { DecisionsInput, SuggestionDecision } from "@/lib/suggestions/schemas";

export function decisionRequests(ghosts: readonly GhostShape[], decision: SuggestionDecision): DecisionsInput[] {
  const byModel = new Map<string, DecisionsInput["decisions"]>();
  for (const ghost of ghosts) {
    if (ghost.role !== "defect" || !ghost.learned) continue;
    const list = byModel.get(ghost.learned.modelId) ?? [];
    list.push({ defect: ghost.defect, shape: ghost.shape, score: ghost.learned.score, decision });
    byModel.set(ghost.learned.modelId, list);
  }
  return [...byModel].map(([modelId, decisions]) => ({ modelId, decisions }));
}

export const isLearned = (ghost: GhostShape) => ghost.role === "defect" && ghost.learned !== undefined;
