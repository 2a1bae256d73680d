/**
 * The classifier: a seeded random forest trained with ml-random-forest (CART trees, Gini gain,
 * bootstrap samples, a random subset of the features per tree), then copied into flat arrays:
 * the stored model is plain JSON, about a third of the library's own export, and scoring walks
 * those arrays directly. A cell's score for a class is the mean over the trees of the class's
 * share in the leaf the cell lands in ("soft voting", as scikit-learn's RandomForestClassifier
 * predict_proba does; from memory), which ranks cells more finely than counting hard votes.
 */
import { RandomForestClassifier } from "ml-random-forest";

export type ForestOptions = { trees: number; maxDepth: number; featureShare: number; minLeafSamples: number; seed: number };

/** One tree: node k is a split on `feature[k] < threshold[k]` (left) or, when feature[k] = −1, leaf `leaf[k]`. */
export type FlatTree = { feature: number[]; threshold: number[]; left: number[]; right: number[]; leaf: number[]; leaves: number[][] };
export type FlatForest = { classes: number; trees: FlatTree[] };

type LibraryNode = { splitColumn?: number; splitValue?: number; left?: LibraryNode; right?: LibraryNode; distribution?: number[][] | number[] };
/** The library's export after a JSON round trip (its leaves hold matrices until serialised). */
type LibraryForest = { baseModel: { indexes: number[][]; estimators: { root: LibraryNode }[] } };

/** Seven significant digits keep every split on the same side for feature values of this scale. */
const precise = (value: number) => Number(value.toPrecision(7));
const share = (value: number) => Math.round(value * 1e4) / 1e4;

function flatten(root: LibraryNode, columns: number[], classes: number): FlatTree {
  const tree: FlatTree = { feature: [], threshold: [], left: [], right: [], leaf: [], leaves: [] };
  const visit = (node: LibraryNode): number => {
    const index = tree.feature.length;
    tree.feature.push(-1);
    tree.threshold.push(0);
    tree.left.push(-1);
    tree.right.push(-1);
    tree.leaf.push(-1);
    if (node.left && node.right && node.splitColumn !== undefined && node.splitValue !== undefined) {
      tree.feature[index] = columns[node.splitColumn];
      tree.threshold[index] = precise(node.splitValue);
      tree.left[index] = visit(node.left);
      tree.right[index] = visit(node.right);
    } else {
      // A leaf's distribution only reaches its own largest label: pad to every class.
      const raw = (Array.isArray(node.distribution?.[0]) ? node.distribution[0] : (node.distribution ?? [])) as number[];
      tree.leaf[index] = tree.leaves.length;
      tree.leaves.push(Array.from({ length: classes }, (_, c) => share(raw[c] ?? 0)));
    }
    return index;
  };
  visit(root);
  return tree;
}

/** Trains on `rows` (features) with labels 0 … classes − 1. */
export function trainForest(rows: number[][], labels: number[], classes: number, options: ForestOptions): FlatForest {
  const forest = new RandomForestClassifier({
    seed: options.seed,
    nEstimators: options.trees,
    maxFeatures: options.featureShare,
    replacement: false,
    useSampleBagging: true,
    noOOB: true,
    treeOptions: { maxDepth: options.maxDepth, minNumSamples: options.minLeafSamples },
  });
  forest.train(rows, labels);
  const { baseModel } = JSON.parse(JSON.stringify(forest.toJSON())) as LibraryForest;
  return { classes, trees: baseModel.estimators.map((estimator, k) => flatten(estimator.root, baseModel.indexes[k], classes)) };
}

/** Index into `tree.leaves` of the leaf `row` lands in. */
export function leafOf(tree: FlatTree, row: ArrayLike<number>): number {
  let node = 0;
  while (tree.feature[node] >= 0) node = row[tree.feature[node]] < tree.threshold[node] ? tree.left[node] : tree.right[node];
  return tree.leaf[node];
}

/** Mean leaf share per class for each row: result[c][r]. */
export function scoreRows(forest: FlatForest, rows: readonly ArrayLike<number>[]): Float32Array[] {
  const scores = Array.from({ length: forest.classes }, () => new Float32Array(rows.length));
  const weight = 1 / forest.trees.length;
  for (const tree of forest.trees) {
    for (let r = 0; r < rows.length; r++) {
      const leaf = tree.leaves[leafOf(tree, rows[r])];
      for (let c = 0; c < forest.classes; c++) scores[c][r] += leaf[c] * weight;
    }
  }
  return scores;
}
