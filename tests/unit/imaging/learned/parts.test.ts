/**
 * The building blocks of learned suggestions, each against a reference:
 * - the histogram forest trainer against ml-random-forest 2.1.0 (npm, the general-purpose random
 *   forest the issue names) on the same seeded data: held-out accuracy no worse than the library's;
 * - the library's trees copied into flat arrays give the same per-tree answers as the library;
 * - direction bins against Math.atan2; LBP riu2 against the count of uniform 8-bit patterns (58:
 *   Ojala, Pietikäinen & Mäenpää 2002; (b) from memory); box means against a brute-force mean.
 */
import { describe, expect, it } from "vitest";
import { RandomForestClassifier } from "ml-random-forest";
import { boxMeans, directionBin, LBP_RIU2 } from "@/lib/imaging/learned/cell-grid";
import { FEATURE_COUNT, FEATURE_NAMES } from "@/lib/imaging/learned/features";
import { leafOf, scoreRows, trainForest } from "@/lib/imaging/learned/forest";
import { trainHistogramForest } from "@/lib/imaging/learned/histogram-forest";
import { convexHull } from "@/lib/imaging/learned/proposals";
import { mulberry32 } from "@/support/prng";

/** Three classes in 6 features: two informative (overlapping Gaussian blobs), four noise. */
function blobs(count: number, seed: number) {
  const random = mulberry32(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const centres = [
    [0, 0],
    [2.2, 0.5],
    [0.8, 2.4],
  ];
  const rows: number[][] = [];
  const labels: number[] = [];
  for (let k = 0; k < count; k++) {
    const label = k % 3;
    rows.push([centres[label][0] + normal(), centres[label][1] + normal(), normal(), normal(), random(), random()]);
    labels.push(label);
  }
  return { rows, labels };
}

const argmax = (scores: Float32Array[], r: number) => scores.reduce((best, s, c) => (s[r] > scores[best][r] ? c : best), 0);
const accuracy = (scores: Float32Array[], labels: number[]) => labels.filter((l, r) => argmax(scores, r) === l).length / labels.length;

describe("forest trainers", () => {
  // ml-random-forest's training time grows with the square of the sample: keep it small.
  const train = blobs(300, 1);
  const test = blobs(600, 2);
  const options = { trees: 15, maxDepth: 8, minLeafSamples: 3, seed: 7, featureShare: 0.6 };

  it("the histogram trainer is at least as accurate as ml-random-forest on held-out data", () => {
    const ours = accuracy(scoreRows(trainHistogramForest(train.rows, train.labels, 3, options), test.rows), test.labels);
    const library = accuracy(scoreRows(trainForest(train.rows, train.labels, 3, options), test.rows), test.labels);
    console.log(`held-out accuracy on 3 blobs: histogram forest ${ours.toFixed(3)}, ml-random-forest ${library.toFixed(3)}`);
    // Bayes-optimal accuracy for these overlapping blobs is about 0.8; both must be near it.
    expect(library).toBeGreaterThan(0.7);
    expect(ours).toBeGreaterThanOrEqual(library - 0.02);
  }, 120_000);

  it("is reproducible from its seed", () => {
    const a = trainHistogramForest(train.rows, train.labels, 3, options);
    expect(trainHistogramForest(train.rows, train.labels, 3, options)).toEqual(a);
    expect(trainHistogramForest(train.rows, train.labels, 3, { ...options, seed: 8 })).not.toEqual(a);
  }, 30_000);

  it("copies ml-random-forest's trees faithfully: each flat tree answers as the library's tree does", () => {
    const library = new RandomForestClassifier({ seed: 3, nEstimators: 5, maxFeatures: 0.6, replacement: false, useSampleBagging: true, noOOB: true, treeOptions: { maxDepth: 6, minNumSamples: 3 } });
    library.train(train.rows, train.labels);
    const flat = trainForest(train.rows, train.labels, 3, { trees: 5, maxDepth: 6, minLeafSamples: 3, seed: 3, featureShare: 0.6 });
    // predictionValues: one column per tree, the class each tree predicts (the largest leaf share).
    const perTree = library.predictionValues(test.rows);
    for (let r = 0; r < 100; r++) {
      flat.trees.forEach((tree, t) => {
        const leaf = tree.leaves[leafOf(tree, test.rows[r])];
        expect(leaf.indexOf(Math.max(...leaf))).toBe(perTree.get(r, t));
      });
    }
  }, 60_000);
});

describe("pixel measurements", () => {
  it("direction bins agree with atan2 (unsigned, 8 bins of 22.5°)", () => {
    const random = mulberry32(5);
    for (let k = 0; k < 2000; k++) {
      const [gx, gy] = [random() * 2 - 1, random() * 2 - 1];
      let angle = Math.atan2(gy, gx);
      if (angle < 0) angle += Math.PI;
      expect(directionBin(gx, gy)).toBe(Math.min(7, Math.floor((angle / Math.PI) * 8)));
    }
  });

  it("LBP riu2 maps the 58 uniform patterns to 0–8 and the other 198 to 9", () => {
    expect([...LBP_RIU2].filter((code) => code < 9)).toHaveLength(58);
    expect(LBP_RIU2[0]).toBe(0);
    expect(LBP_RIU2[0b00001111]).toBe(4);
    expect(LBP_RIU2[0b01010101]).toBe(9);
  });

  it("box means equal a brute-force mean, clipped at the borders", () => {
    const [width, height, r] = [13, 9, 2];
    const random = mulberry32(9);
    const values = Float32Array.from({ length: width * height }, () => random() * 255);
    const means = boxMeans(values, width, height, r);
    for (let y = 0; y < height; y++) {
      for (let x = 0; x < width; x++) {
        let [sum, n] = [0, 0];
        for (let yy = Math.max(0, y - r); yy <= Math.min(height - 1, y + r); yy++) {
          for (let xx = Math.max(0, x - r); xx <= Math.min(width - 1, x + r); xx++) {
            sum += values[yy * width + xx];
            n++;
          }
        }
        expect(means[y * width + x]).toBeCloseTo(sum / n, 3);
      }
    }
  });

  it("names every feature it computes, once", () => {
    expect(FEATURE_NAMES).toHaveLength(FEATURE_COUNT);
    expect(new Set(FEATURE_NAMES).size).toBe(FEATURE_COUNT);
  });

  it("convex hull of cell corners keeps only the outer corners", () => {
    const hull = convexHull([
      [0, 0],
      [8, 0],
      [8, 8],
      [0, 8],
      [8, 0],
      [16, 0],
      [16, 8],
      [8, 8],
      [4, 4],
    ]);
    expect(hull).toHaveLength(4);
    expect(new Set(hull.map((p) => p.join(",")))).toEqual(new Set(["0,0", "16,0", "16,8", "0,8"]));
  });
});
