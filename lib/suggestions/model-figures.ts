/**
 * What the Gallery's Suggestions panel says about each stored model, worked out here so it is
 * unit-tested: one row per class the model knows (what it learned from, its held-out figures,
 * whether it may suggest it and why), where its examples came from, and the rules in words.
 * Pure; the data is GET /api/suggestion-models's (lib/suggestions/models.ts).
 */
import type { SuggestionModelDto, SuggestionModelHistory } from "./dto";

export type ClassRow = {
  defect: string;
  label: string;
  learnedRegions: number;
  learnedPhotos: number;
  /** Held-out figures at the model's IoU threshold; null when no held-out photo had the class or a suggestion of it. */
  heldOut: { accepted: number; suggested: number; hits: number; recall: number; precision: number } | null;
  suggest: boolean;
  reason: string;
};

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** One row per class the model learned or was judged on, in class-name order. */
export function classRows(model: Pick<SuggestionModelDto, "classCounts" | "evaluation" | "suggestable">, labels: Readonly<Record<string, string>> = {}): ClassRow[] {
  // A class can be judged without being learned (only held-out photos had it): it gets a row too.
  const classes = [...new Set([...Object.keys(model.classCounts), ...Object.keys(model.evaluation.byClass), ...model.suggestable.map((c) => c.defect)])].sort();
  return classes.map((defect) => {
    const counts = Object.hasOwn(model.classCounts, defect) ? model.classCounts[defect] : { regions: 0, photos: 0 };
    const figures = Object.hasOwn(model.evaluation.byClass, defect) ? model.evaluation.byClass[defect] : null;
    const decision = model.suggestable.find((c) => c.defect === defect);
    return {
      defect,
      label: Object.hasOwn(labels, defect) ? labels[defect] : defect,
      learnedRegions: counts.regions,
      learnedPhotos: counts.photos,
      heldOut: figures && { accepted: figures.accepted, suggested: figures.suggested, hits: figures.hits, recall: figures.recall, precision: figures.precision },
      suggest: decision?.suggest ?? false,
      reason: decision?.reason ?? (figures ? "not learned: only held-out photos had it" : "not judged"),
    };
  });
}

/** Where the model's examples came from, in one sentence. */
export function describeSources({ sources, evaluation }: Pick<SuggestionModelDto, "sources" | "evaluation">): string {
  const test = `judged on ${plural(evaluation.photos, "held-out photo")}`;
  if (sources.syntheticPhotos) return `Demo model: learned from ${plural(sources.syntheticPhotos, "synthetic photo")} the seed rendered (none of this workspace's), ${test}.`;
  const parts = [plural(sources.unitPhotos, "graded unit photo"), plural(sources.galleryPhotos, "gallery photo"), plural(sources.dismissalPhotos, "photo")];
  return `Learned from ${parts[0]}, ${parts[1]} and ${parts[2]} with dismissed suggestions (${plural(sources.acceptedRegions, "accepted region")} in the workspace then), ${test}.`;
}

/** The rules the panel states under the history. */
export function describeRules(rules: SuggestionModelHistory["rules"]): string[] {
  const r = rules.suggestion;
  return [
    `A suggestion counts as a hit when it overlaps an accepted region of the same class with IoU ≥ ${rules.iouThreshold}; recall = hits ÷ accepted regions, precision = hits ÷ suggestions, on photos the model never learned from.`,
    `A class is suggested only when the model learned it from at least ${r.minTrainingRegions} regions on ${r.minTrainingPhotos} photos, the held-out photos hold at least ${r.minTestRegions} of its regions, and there its recall is at least ${r.minRecall} and its precision at least ${r.minPrecision}.`,
    "A new model is switched in only when its mean held-out F1 over the classes either model may suggest is at least that of the model in use, on the same held-out photos; on a tie, a model that may suggest nothing never replaces one.",
    `Training starts on its own once the workspace has ${rules.firstTrainingRegions} accepted regions, then after every ${rules.retrainAfterNewRegions} new ones; “Train now” starts one at once.`,
  ];
}

/** "1.2 s" / "48 s" for a training's duration. */
export const formatDuration = (ms: number) => (ms < 10_000 ? `${(ms / 1000).toFixed(1)} s` : `${Math.round(ms / 1000)} s`);
