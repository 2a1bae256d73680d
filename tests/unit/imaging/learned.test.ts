/**
 * Learned suggestions on synthetic photos the test renders itself (db/seed/defect-photos.ts: a
 * part on a plain backdrop with scratches, cracks and stains planted at known places, seeded):
 * trained on photos 0–39, judged on photos 100–119, which it never saw. The floor (issue 20):
 * recall >= 0.7 and precision >= 0.5 for scratch and stain at IoU >= 0.3. Figures are printed.
 *
 * Cost on this 2-core machine: rendering the 60 photos ≈ 13 s of CPU, training ≈ 10 s, the 20
 * suggestion runs ≈ 3.5 s (measured while other work shared the cores; wall time was about 3×).
 */
import { beforeAll, describe, expect, it } from "vitest";
import sharp from "sharp";
import { renderDefectPhotos } from "@/db/seed/defect-photos";
import type { AnnotatedPartPhoto } from "@/db/seed/photo-art";
import { describeShapeProblem } from "@/lib/geometry/degenerate";
import { AppError } from "@/lib/errors";
import { suggestRegions, trainRegionModel, type RegionModel } from "@/lib/imaging/learned";
import { evaluateRegionModel, evaluateSuggestions, type Evaluation } from "@/lib/imaging/learned-eval";
import { scaleShape } from "@/lib/imaging/learned/working-image";
import { boundsOfShape } from "@/lib/geometry/bounds";

const WIDTH = 960;
let train: AnnotatedPartPhoto[];
let test: AnnotatedPartPhoto[];
let model: RegionModel;
let evaluation: Evaluation;

const asExample = (p: AnnotatedPartPhoto) => ({ image: p.jpeg, regions: p.regions, surface: [p.surface] });

beforeAll(async () => {
  train = await renderDefectPhotos(0, 40, WIDTH);
  test = await renderDefectPhotos(100, 20, WIDTH);
  model = await trainRegionModel(train.map(asExample));
  evaluation = await evaluateRegionModel(
    model,
    test.map((p) => ({ image: p.jpeg, width: p.width, height: p.height, regions: p.regions, surface: [p.surface] })),
  );
  for (const [defect, f] of Object.entries(evaluation.byClass)) {
    console.log(`learned suggestions, held-out ${defect}: recall ${f.recall} (${f.hits}/${f.accepted}), precision ${f.precision} (${f.hits}/${f.suggested}), F1 ${f.f1}`);
  }
  console.log(`model JSON ${(JSON.stringify(model).length / 1024).toFixed(0)} KiB`);
}, 600_000);

// Each suggestion run decodes and scores a photo: seconds on a busy 2-core machine.
describe("learned suggestions on held-out synthetic photos", { timeout: 60_000 }, () => {
  it.each(["scratch", "stain"])("%s: recall >= 0.7 and precision >= 0.5 at IoU >= 0.3", (defect) => {
    const figures = evaluation.byClass[defect];
    expect(figures.accepted).toBeGreaterThanOrEqual(10);
    expect(figures.recall).toBeGreaterThanOrEqual(0.7);
    expect(figures.precision).toBeGreaterThanOrEqual(0.5);
  });

  it("stores what it saw: version, feature list, per-class counts and thresholds, as plain JSON", () => {
    expect(model.format).toBe("partproof.region-model");
    expect(model.version).toBe(1);
    expect(model.features).toHaveLength(47);
    expect(model.classes.map((c) => c.defect)).toEqual(["crack", "scratch", "stain"]);
    const scratch = model.classes.find((c) => c.defect === "scratch")!;
    // 40 photos, each with one scratch and every fifth with a second (plantedOn).
    expect(scratch.regions).toBe(48);
    expect(scratch.photos).toBe(40);
    expect(scratch.kind).toBe("line");
    expect(model.classes.find((c) => c.defect === "stain")!.kind).toBe("outline");
    for (const c of model.classes) {
      expect(c.threshold).toBeGreaterThan(0);
      expect(c.threshold).toBeLessThanOrEqual(1);
    }
    expect(JSON.parse(JSON.stringify(model))).toEqual(model);
    // Plain data also crosses a worker-thread boundary (the structured clone a postMessage makes).
    expect(structuredClone(model)).toEqual(model);
  });

  it("suggests valid shapes inside the photo, best first, scores in 0..1, the same from the JSON copy", async () => {
    const photo = test[0];
    const found = await suggestRegions(model, photo.jpeg, { surface: [photo.surface] });
    expect(found.length).toBeGreaterThan(0);
    for (const s of found) {
      expect(describeShapeProblem(s.shape)).toBeNull();
      const box = boundsOfShape(s.shape);
      expect(box.minX).toBeGreaterThanOrEqual(0);
      expect(box.maxX).toBeLessThanOrEqual(photo.width);
      expect(s.score).toBeGreaterThan(0);
      expect(s.score).toBeLessThanOrEqual(1);
    }
    expect(found.map((s) => s.score)).toEqual(found.map((s) => s.score).sort((a, b) => b - a));
    expect(await suggestRegions(JSON.parse(JSON.stringify(model)), photo.jpeg, { surface: [photo.surface] })).toEqual(found);
  });

  it("answers in the pixels of the image it is given (here 2 × the training size)", async () => {
    const photo = test[1];
    const big = await sharp(photo.jpeg)
      .resize(photo.width * 2)
      .jpeg({ quality: 92 })
      .toBuffer();
    const s = photo.surface;
    if (s.kind !== "rect") throw new Error("the renderer's Surface is a rect");
    const surface = [{ kind: "rect" as const, x: s.x * 2, y: s.y * 2, width: s.width * 2, height: s.height * 2 }];
    const atSize = await suggestRegions(model, photo.jpeg, { surface: [photo.surface] });
    const atDouble = await suggestRegions(model, big, { surface });
    expect(atSize.length).toBeGreaterThan(0);
    // The 1 × suggestions, doubled, are found again at 2 × (same class, IoU >= 0.3); both photos
    // become the same working copy, so only resampling and JPEG noise separate the two runs.
    const doubled = atSize.map((s) => ({ defect: s.defect, shape: scaleShape(s.shape, 2, 2) }));
    const again = evaluateSuggestions([{ width: photo.width * 2, height: photo.height * 2, accepted: doubled, suggested: atDouble }]);
    const hits = Object.values(again.byClass).reduce((n, f) => n + f.hits, 0);
    expect(hits / atSize.length).toBeGreaterThanOrEqual(0.8);
  });

  it("looks only inside the Surface it is given, and only for the classes asked for", async () => {
    const photo = test[2];
    const corner = [{ kind: "rect" as const, x: 0, y: 0, width: 60, height: 60 }];
    // The backdrop corner may hold grain the model takes for a faint scratch (the renders' grain
    // is not seeded), so the property is "nothing outside the corner", not "nothing at all".
    const inCorner = await suggestRegions(model, photo.jpeg, { surface: corner });
    for (const s of inCorner) {
      const box = boundsOfShape(s.shape);
      expect(box.minX).toBeGreaterThanOrEqual(0);
      expect(box.minY).toBeGreaterThanOrEqual(0);
      expect(box.maxX).toBeLessThanOrEqual(60);
      expect(box.maxY).toBeLessThanOrEqual(60);
    }
    const onlyStains = await suggestRegions(model, photo.jpeg, { surface: [photo.surface], defects: ["stain"] });
    expect(onlyStains.every((s) => s.defect === "stain")).toBe(true);
  });

  it("refuses bad input with a sentence, and a model of another version", async () => {
    await expect(trainRegionModel([])).rejects.toThrow(AppError);
    await expect(trainRegionModel([{ image: Buffer.from("not a photo"), regions: [{ defect: "scratch", shape: { kind: "spot", x: 1, y: 1, radius: 0 } }] }])).rejects.toThrow(
      /examples are not usable/,
    );
    await expect(trainRegionModel([{ image: test[0].jpeg, regions: [] }])).rejects.toThrow(/No defect class has 3 or more/);
    await expect(trainRegionModel([asExample(test[0])], { trees: 0 })).rejects.toThrow(/Invalid training options/);
    await expect(suggestRegions({ ...model, version: 0 } as unknown as RegionModel, test[0].jpeg)).rejects.toThrow(/retrain the model/);
    await expect(suggestRegions(model, Buffer.from("not a photo"))).rejects.toThrow(/could not be decoded/);
  });
});
