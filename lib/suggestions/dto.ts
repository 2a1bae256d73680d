/** Shapes of the learned-suggestion API that the Bench and the server share. */
import type { Shape } from "@/lib/geometry/shape";

export type LearnedGhost = { id: string; role: "defect"; defect: string; shape: Shape; score: number; label: string };
export type LearnedSuggestionResponse = { modelId: string | null; modelVersion: number | null; ghosts: LearnedGhost[]; note: string };
