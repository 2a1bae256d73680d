/**
 * A random forest trainer of our own (Breiman 2001: bootstrap sample per tree, a fresh random
 * subset of √(features) candidates at every split, Gini impurity; from memory), with split search
 * over quantile bins as histogram-based gradient-boosting libraries do it: each feature is cut
 * into at most `bins` ranges once, and a node finds its best split in one pass over its samples
 * per candidate feature. ml-random-forest (ml-cart) tries every midpoint with a fresh pass, which
 * grows with the square of the sample (measured here: 26 s of CPU for 10 trees on 1 200 cells),
 * so it could only learn from a few hundred cells within the training-time target. Both write
 * the same flat trees (forest.ts); the library stays selectable and is the reference the unit
 * tests compare this trainer with.
 */
import type { FlatForest, FlatTree } from "./forest";
import { seededRandom } from "./sampling";

export type HistogramForestOptions = { trees: number; maxDepth: number; minLeafSamples: number; seed: number; bins?: number };

const DEFAULT_BINS = 32;
const share = (value: number) => Math.round(value * 1e4) / 1e4;

/** Up to `bins − 1` cut values per feature at quantiles of the training values (distinct, ascending). */
export function quantileCuts(rows: readonly ArrayLike<number>[], feature: number, bins: number): number[] {
  const sorted = Float64Array.from(rows, (row) => row[feature]).sort();
  const cuts: number[] = [];
  for (let k = 1; k < bins; k++) {
    const value = sorted[Math.floor((k * sorted.length) / bins)];
    // A cut equal to the smallest value would send nothing left.
    if (value > sorted[0] && (cuts.length === 0 || value > cuts[cuts.length - 1])) cuts.push(value);
  }
  return cuts;
}

/** Bin of `value` among `cuts`: the number of cuts <= value (binary search). */
function binOf(cuts: readonly number[], value: number): number {
  let low = 0;
  let high = cuts.length;
  while (low < high) {
    const mid = (low + high) >> 1;
    if (cuts[mid] <= value) low = mid + 1;
    else high = mid;
  }
  return low;
}

type Data = { binned: Uint8Array[]; cuts: number[][]; labels: Uint8Array; classes: number };

function gini(counts: Float64Array, offset: number, classes: number, total: number): number {
  if (total <= 0) return 0;
  let sum = 0;
  for (let c = 0; c < classes; c++) sum += (counts[offset + c] / total) ** 2;
  return 1 - sum;
}

function growTree(data: Data, sample: Uint32Array, options: Required<HistogramForestOptions>, random: () => number): FlatTree {
  const { binned, cuts, labels, classes } = data;
  const features = binned.length;
  const tryFeatures = Math.max(1, Math.round(Math.sqrt(features)));
  const tree: FlatTree = { feature: [], threshold: [], left: [], right: [], leaf: [], leaves: [] };
  const histogram = new Float64Array(options.bins * classes);
  const leftCounts = new Float64Array(classes);
  const totals = new Float64Array(classes);

  const makeLeaf = (index: number, members: Uint32Array) => {
    const counts = new Float64Array(classes);
    for (const i of members) counts[labels[i]]++;
    tree.leaf[index] = tree.leaves.length;
    tree.leaves.push(Array.from(counts, (n) => share(n / members.length)));
  };

  const grow = (members: Uint32Array, depth: number): number => {
    const index = tree.feature.length;
    tree.feature.push(-1);
    tree.threshold.push(0);
    tree.left.push(-1);
    tree.right.push(-1);
    tree.leaf.push(-1);
    totals.fill(0);
    for (const i of members) totals[labels[i]]++;
    const n = members.length;
    const parentGini = gini(totals, 0, classes, n);
    if (depth >= options.maxDepth || n < 2 * options.minLeafSamples || parentGini === 0) {
      makeLeaf(index, members);
      return index;
    }
    let best = { gain: 1e-9, feature: -1, bin: -1 };
    // A partial Fisher–Yates shuffle picks the candidate features for this split.
    const order = Array.from({ length: features }, (_, k) => k);
    for (let k = 0; k < tryFeatures; k++) {
      const j = k + Math.floor(random() * (features - k));
      [order[k], order[j]] = [order[j], order[k]];
      const f = order[k];
      const bins = cuts[f].length + 1;
      if (bins < 2) continue;
      histogram.fill(0, 0, bins * classes);
      const column = binned[f];
      for (const i of members) histogram[column[i] * classes + labels[i]]++;
      leftCounts.fill(0);
      let leftTotal = 0;
      for (let b = 0; b < bins - 1; b++) {
        for (let c = 0; c < classes; c++) {
          leftCounts[c] += histogram[b * classes + c];
          leftTotal += histogram[b * classes + c];
        }
        const rightTotal = n - leftTotal;
        if (leftTotal < options.minLeafSamples || rightTotal < options.minLeafSamples) continue;
        let rightGini = 1;
        for (let c = 0; c < classes; c++) rightGini -= ((totals[c] - leftCounts[c]) / rightTotal) ** 2;
        const gain = parentGini - (leftTotal / n) * gini(leftCounts, 0, classes, leftTotal) - (rightTotal / n) * rightGini;
        if (gain > best.gain) best = { gain, feature: f, bin: b };
      }
    }
    if (best.feature < 0) {
      makeLeaf(index, members);
      return index;
    }
    const column = binned[best.feature];
    const goesLeft = (i: number) => column[i] <= best.bin;
    let leftSize = 0;
    for (const i of members) if (goesLeft(i)) leftSize++;
    const leftMembers = new Uint32Array(leftSize);
    const rightMembers = new Uint32Array(n - leftSize);
    let [l, r] = [0, 0];
    for (const i of members) {
      if (goesLeft(i)) leftMembers[l++] = i;
      else rightMembers[r++] = i;
    }
    // Bins <= b hold the values below cut b, so "value < cut" is the same test on raw values.
    tree.feature[index] = best.feature;
    tree.threshold[index] = cuts[best.feature][best.bin];
    tree.left[index] = grow(leftMembers, depth + 1);
    tree.right[index] = grow(rightMembers, depth + 1);
    return index;
  };
  grow(sample, 0);
  return tree;
}

/** Trains on `rows` with labels 0 … classes − 1; the same seed gives the same forest. */
export function trainHistogramForest(rows: readonly ArrayLike<number>[], labels: readonly number[], classes: number, options: HistogramForestOptions): FlatForest {
  const settings = { bins: DEFAULT_BINS, ...options };
  const features = rows[0]?.length ?? 0;
  const cuts = Array.from({ length: features }, (_, f) => quantileCuts(rows, f, settings.bins));
  const binned = cuts.map((featureCuts, f) => Uint8Array.from(rows, (row) => binOf(featureCuts, row[f])));
  const data: Data = { binned, cuts, labels: Uint8Array.from(labels), classes };
  const random = seededRandom(settings.seed);
  const trees: FlatTree[] = [];
  for (let t = 0; t < settings.trees; t++) {
    const sample = Uint32Array.from({ length: rows.length }, () => Math.floor(random() * rows.length));
    trees.push(growTree(data, sample, settings, random));
  }
  return { classes, trees };
}
