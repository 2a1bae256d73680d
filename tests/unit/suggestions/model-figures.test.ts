/** What the Gallery's Suggestions panel says of each model (lib/suggestions/model-figures.ts). */
import { describe, expect, it } from "vitest";
import { EVALUATION_IOU, SUGGESTION_RULE } from "@/lib/imaging/learned-eval";
import type { SuggestionModelDto } from "@/lib/suggestions/dto";
import { classRows, describeRules, describeSources, formatDuration } from "@/lib/suggestions/model-figures";

const model: Pick<SuggestionModelDto, "classCounts" | "evaluation" | "suggestable" | "sources"> = {
  classCounts: { scratch: { regions: 48, photos: 40 }, crack: { regions: 24, photos: 24 } },
  evaluation: {
    iouThreshold: 0.3,
    photos: 16,
    byClass: {
      scratch: { accepted: 19, suggested: 22, hits: 17, recall: 0.895, precision: 0.773, f1: 0.829 },
      // Judged, but never learned (a class only the test photos had).
      stain: { accepted: 0, suggested: 3, hits: 0, recall: 0, precision: 0, f1: 0 },
    },
  },
  suggestable: [
    { defect: "crack", suggest: false, reason: "learned from 24 regions (needs 30)" },
    { defect: "scratch", suggest: true, reason: "held-out recall 0.895, precision 0.773 on 19 regions" },
  ],
  sources: { unitPhotos: 12, galleryPhotos: 1, dismissalPhotos: 0, testPhotos: 16, acceptedRegions: 61 },
};

describe("classRows", () => {
  it("gives one row per class learned or judged, sorted, with labels, counts, held-out figures and the rule's verdict", () => {
    expect(classRows(model, { scratch: "Scratch", crack: "Crack" })).toEqual([
      { defect: "crack", label: "Crack", learnedRegions: 24, learnedPhotos: 24, heldOut: null, suggest: false, reason: "learned from 24 regions (needs 30)" },
      {
        defect: "scratch",
        label: "Scratch",
        learnedRegions: 48,
        learnedPhotos: 40,
        heldOut: { accepted: 19, suggested: 22, hits: 17, recall: 0.895, precision: 0.773 },
        suggest: true,
        reason: "held-out recall 0.895, precision 0.773 on 19 regions",
      },
      {
        defect: "stain",
        label: "stain",
        learnedRegions: 0,
        learnedPhotos: 0,
        heldOut: { accepted: 0, suggested: 3, hits: 0, recall: 0, precision: 0 },
        suggest: false,
        reason: "not learned: only held-out photos had it",
      },
    ]);
  });

  it("keeps a class named like an Object property as data, and falls back to the key without a label", () => {
    const odd = { ...model, classCounts: { constructor: { regions: 2, photos: 1 } }, evaluation: { ...model.evaluation, byClass: {} }, suggestable: [] };
    expect(classRows(odd)).toEqual([{ defect: "constructor", label: "constructor", learnedRegions: 2, learnedPhotos: 1, heldOut: null, suggest: false, reason: "not judged" }]);
  });
});

describe("describeSources", () => {
  it("counts the workspace's photos, and says plainly when the model is the seed's demo model", () => {
    expect(describeSources(model)).toBe(
      "Learned from 12 graded unit photos, 1 gallery photo and 0 photos with dismissed suggestions (61 accepted regions in the workspace then), judged on 16 held-out photos.",
    );
    expect(describeSources({ ...model, sources: { ...model.sources, syntheticPhotos: 40 } })).toBe(
      "Demo model: learned from 40 synthetic photos the seed rendered (none of this workspace's), judged on 16 held-out photos.",
    );
  });
});

describe("describeRules", () => {
  it("states the hit rule, the suggestion rule and the switching rule with the numbers the job applies", () => {
    const lines = describeRules({ iouThreshold: EVALUATION_IOU, suggestion: SUGGESTION_RULE, firstTrainingRegions: 60, retrainAfterNewRegions: 50 });
    expect(lines[0]).toContain("IoU ≥ 0.3");
    expect(lines[1]).toBe(
      "A class is suggested only when the model learned it from at least 30 regions on 10 photos, the held-out photos hold at least 8 of its regions, and there its recall is at least 0.6 and its precision at least 0.4.",
    );
    expect(lines[2]).toContain("on a tie, a model that may suggest nothing never replaces one");
    expect(lines[3]).toContain("60 accepted regions, then after every 50 new ones");
  });
});

describe("formatDuration", () => {
  it("keeps a decimal below 10 s only", () => {
    expect([formatDuration(1234), formatDuration(9_949), formatDuration(41_600)]).toEqual(["1.2 s", "9.9 s", "42 s"]);
  });
});
