/** Which photos a training run learns from and which it is judged on (lib/suggestions/training-set.ts). */
import { describe, expect, it } from "vitest";
import { splitByPhoto } from "@/lib/imaging/learned-eval";
import { mergeLabelled, planTraining, TEST_SHARE, trainingDue, type DismissalPhoto, type LabelledPhoto } from "@/lib/suggestions/training-set";

const geometry = (photoId: string) => ({ photoId, previewKey: `p/${photoId}`, width: 4000, height: 3000, previewWidth: 2000, previewHeight: 1500 });
const labelled = (photoId: string, source: "unit" | "gallery" = "unit", defect = "scratch"): LabelledPhoto => ({
  ...geometry(photoId),
  source,
  regions: [{ defect, shape: { kind: "rect", x: 100, y: 200, width: 40, height: 20 } }],
  surfaces: [
    {
      kind: "polygon",
      points: [
        [0, 0],
        [4000, 0],
        [4000, 3000],
      ],
    },
  ],
});
const ids = Array.from({ length: 200 }, (_, k) => `00000000-0000-4000-8000-${String(k).padStart(12, "0")}`);

describe("planTraining", () => {
  it("never puts a photo on both sides, and splits as splitByPhoto does", () => {
    const plan = planTraining(
      ids.map((id) => labelled(id)),
      [],
    );
    const train = new Set(plan.train.map((p) => p.photoId));
    const test = plan.test.map((p) => p.photoId);
    expect(test.filter((id) => train.has(id))).toEqual([]);
    expect(new Set(test)).toEqual(new Set(splitByPhoto(ids, (id) => id, { testShare: TEST_SHARE }).test));
    expect(train.size + test.length).toBe(ids.length);
    // About a fifth held out (a hash split, so not exactly).
    expect(test.length).toBeGreaterThan(20);
    expect(test.length).toBeLessThan(60);
  });

  it("scales shapes from original pixels to the preview's, per axis", () => {
    const plan = planTraining([labelled(ids[0]), labelled(ids[1])], []);
    const photo = [...plan.train, ...plan.test][0];
    expect(photo.width).toBe(2000);
    expect(photo.regions[0].shape).toEqual({ kind: "rect", x: 50, y: 100, width: 20, height: 10 });
    expect(photo.surface).toEqual([
      {
        kind: "polygon",
        points: [
          [0, 0],
          [2000, 0],
          [2000, 1500],
        ],
      },
    ]);
  });

  it("turns dismissed ghosts on unlabelled photos into training photos whose only clean area is what was dismissed", () => {
    const dismissed: DismissalPhoto = {
      ...geometry("d-1"),
      dismissed: [{ kind: "spot", x: 400, y: 400, radius: 20 }],
      regions: [{ defect: "stain", shape: { kind: "rect", x: 0, y: 0, width: 10, height: 10 } }],
    };
    const alreadyLabelled: DismissalPhoto = { ...geometry(ids[3]), dismissed: [{ kind: "spot", x: 10, y: 10, radius: 5 }], regions: [] };
    const plan = planTraining([labelled(ids[3])], [dismissed, alreadyLabelled]);
    const extra = plan.train.filter((p) => p.source === "dismissals");
    expect(extra.map((p) => p.photoId)).toEqual(["d-1"]);
    expect(extra[0].surface).toEqual([{ kind: "spot", x: 200, y: 200, radius: 10 }]);
    // Its own marks go along, so a cell an inspector marked is never taught as clean.
    expect(extra[0].regions).toEqual([{ defect: "stain", shape: { kind: "rect", x: 0, y: 0, width: 5, height: 5 } }]);
    expect(plan.test.some((p) => p.source === "dismissals")).toBe(false);
    // Accepted regions count labelled photos only.
    expect(plan.acceptedRegions).toBe(1);
  });
});

describe("mergeLabelled", () => {
  it("keeps one entry per photo, the gallery's curated copy winning", () => {
    const merged = mergeLabelled([labelled("b"), labelled("a")], [labelled("b", "gallery", "dent")]);
    expect(merged.map((p) => [p.photoId, p.source, p.regions[0].defect])).toEqual([
      ["a", "unit", "scratch"],
      ["b", "gallery", "dent"],
    ]);
  });
});

describe("trainingDue (the worker's scheduled check)", () => {
  it("asks for a first training at 60 accepted regions, then after every 50 new ones", () => {
    expect(trainingDue(59, null)).toBe(false);
    expect(trainingDue(60, null)).toBe(true);
    expect(trainingDue(109, 60)).toBe(false);
    expect(trainingDue(110, 60)).toBe(true);
    // Regions removed since (a unit regraded): nothing new to learn.
    expect(trainingDue(40, 60)).toBe(false);
  });
});
