/**
 * Training, step by step (every choice seeded, so the same examples give the same model):
 * 1. Classes: every defect with at least `minRegionsPerClass` accepted regions, in name order.
 * 2. Calibration photos: a seeded `calibrationShare` of the photos with regions (capped), set
 *    aside to choose thresholds; the rest are fit photos.
 * 3. Each photo is decoded once (the next one decodes while this one is measured), summed into
 *    cells, and its cells labelled and sampled within per-photo quotas (sampling.ts).
 * 4. A forest trains on the fit photos' cells, scores every cell of the calibration photos, and
 *    the thresholds are set there (calibrate.ts).
 * 5. With `refit`, a second forest trains on the cells of all photos and is the one stored.
 * Nothing here holds state between calls or touches anything but its arguments, so it can run in
 * a worker thread or the job worker.
 */
import type { Shape } from "@/lib/geometry/shape";
import { calibrateThresholds, DEFAULT_THRESHOLD, type CalibrationPhoto } from "./calibrate";
import { FEATURE_NAMES, featureRows } from "./features";
import { scoreRows, trainForest } from "./forest";
import { trainHistogramForest } from "./histogram-forest";
import { REGION_MODEL_FORMAT, REGION_MODEL_VERSION, type ModelClass, type RegionModel, type TrainingSettings } from "./model";
import { preparePhoto, scoreActiveCells, workingRegions } from "./photo-cells";
import type { ClassProposalSpec, ShapeKindForClass } from "./proposals";
import { labelCells, pickCells, seededRandom, shuffled } from "./sampling";
import { countSpans } from "@/lib/imaging/raster/spans";

export type TrainingExample = { image: Buffer; regions: { defect: string; shape: Shape }[]; surface?: Shape[] };

type Sample = { row: number[]; label: number };

/** A class's smallest regions (10th percentile, in cells) × this = the fewest cells a suggestion may have. */
const MIN_CELLS_SHARE = 0.3;

const round = (value: number) => Math.round(value * 1000) / 1000;

function percentile(values: number[], p: number, fallback: number): number {
  if (values.length === 0) return fallback;
  const sorted = values.slice().sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))];
}

/** Runs `work` on each item in order while the next item's `load` is already under way. */
async function eachWithPrefetch<T, L>(items: readonly T[], load: (item: T) => Promise<L>, work: (loaded: L, item: T, index: number) => void): Promise<void> {
  let pending = items.length > 0 ? load(items[0]) : null;
  for (let k = 0; k < items.length; k++) {
    const loaded = await pending!;
    pending = k + 1 < items.length ? load(items[k + 1]) : null;
    work(loaded, items[k], k);
  }
}

type ClassHabit = { line: number[]; spot: number[]; outline: number; cells: number[]; photos: number };
type Plan = {
  defects: string[];
  /** Forest labels: 0 = no defect, k + 1 = defects[k] (also the masks' class indices). */
  label: Map<string, number>;
  calibrationSet: Set<number>;
  quotaFor: (photo: number) => { perClass: Map<number, number>; negatives: number };
};

function plan(examples: readonly TrainingExample[], settings: TrainingSettings, random: () => number): Plan {
  const regionCounts = countRegions(examples);
  const defects = [...regionCounts]
    .filter(([, n]) => n >= settings.minRegionsPerClass)
    .map(([d]) => d)
    .sort();
  if (defects.length === 0) throw new RangeError(`No defect class has ${settings.minRegionsPerClass} or more accepted regions to learn from.`);
  const label = new Map(defects.map((d, k) => [d, k + 1]));
  const withRegions = examples.map((_, k) => k).filter((k) => examples[k].regions.some((r) => label.has(r.defect)));
  const wanted = Math.min(settings.maxCalibrationPhotos, Math.floor(withRegions.length * settings.calibrationShare));
  const calibrationSet = new Set(shuffled(withRegions, random).slice(0, wanted >= 1 && withRegions.length >= 4 ? wanted : 0));
  const all = examples.map((_, k) => k);
  const fit = all.filter((k) => !calibrationSet.has(k));
  // 1.5 × the even share per photo, trimmed to the caps at the end, so photos with few cells of a class leave room for others.
  const quota = (among: number[]) => ({
    perClass: new Map(defects.map((d) => [label.get(d)!, Math.ceil((1.5 * settings.maxCellsPerClass) / Math.max(1, among.filter((k) => examples[k].regions.some((r) => r.defect === d)).length))])),
    negatives: Math.ceil((1.5 * settings.maxNegativeCells) / Math.max(1, among.length)),
  });
  const [fitQuota, allQuota] = [quota(fit), quota(all)];
  return { defects, label, calibrationSet, quotaFor: (k) => (calibrationSet.has(k) ? allQuota : fitQuota) };
}

function countRegions(examples: readonly TrainingExample[]): Map<string, number> {
  const counts = new Map<string, number>();
  for (const e of examples) for (const r of e.regions) counts.set(r.defect, (counts.get(r.defect) ?? 0) + 1);
  return counts;
}

/** Decodes every photo once: training cells, the calibration photos kept whole, and how each class was drawn. */
async function collect(examples: readonly TrainingExample[], settings: TrainingSettings, { defects, label, calibrationSet, quotaFor }: Plan, random: () => number) {
  const fitSamples: Sample[] = [];
  const calibrationSamples: Sample[] = [];
  const calibration: CalibrationPhoto[] = [];
  const habits: ClassHabit[] = defects.map(() => ({ line: [], spot: [], outline: 0, cells: [], photos: 0 }));
  const cellPx = settings.cellSize ** 2;
  await eachWithPrefetch(
    examples.map((_, k) => k),
    (k) => preparePhoto(examples[k].image, examples[k].surface, settings.workingSide, settings.cellSize),
    (photo, k) => {
      const { shapes, masks } = workingRegions(photo, examples[k].regions, label);
      shapes.forEach((s, r) => {
        const habit = habits[s.classIndex - 1];
        if (s.shape.kind === "line") habit.line.push(s.shape.width);
        else if (s.shape.kind === "spot") habit.spot.push(s.shape.radius);
        else habit.outline++;
        habit.cells.push(countSpans(masks[r].spans) / cellPx);
      });
      for (const c of new Set(shapes.map((s) => s.classIndex - 1))) habits[c].photos++;
      const { perClass, negatives } = quotaFor(k);
      const picked = pickCells(photo.grid, labelCells(photo.grid, masks, photo.inside), perClass, negatives, random);
      const rows = featureRows(
        photo.grid,
        picked.map(([cell]) => cell),
      );
      const into = calibrationSet.has(k) ? calibrationSamples : fitSamples;
      rows.forEach((row, r) => into.push({ row, label: picked[r][1] }));
      if (calibrationSet.has(k)) calibration.push({ photo, scores: [], truth: shapes.map((s) => ({ classIndex: s.classIndex - 1, shape: s.shape })) });
    },
  );
  return { fitSamples, calibrationSamples, calibration, habits };
}

/** Shape kind, Line width, Spot radius and smallest size of each class, from what inspectors drew (working px). */
function specsFrom(habits: readonly ClassHabit[]): ClassProposalSpec[] {
  return habits.map((habit) => {
    const kind: ShapeKindForClass = habit.line.length >= Math.max(habit.spot.length, habit.outline) ? "line" : habit.spot.length > habit.outline ? "spot" : "outline";
    const smallest = percentile(habit.cells, 0.1, 1);
    return { kind, threshold: DEFAULT_THRESHOLD, lineWidth: percentile(habit.line, 0.5, 4), spotRadius: percentile(habit.spot, 0.5, 2), minCells: Math.max(1, Math.round(MIN_CELLS_SHARE * smallest)) };
  });
}

/** At most the caps' worth of cells per label, drawn at random. */
function capSamples(samples: readonly Sample[], settings: TrainingSettings, random: () => number): Sample[] {
  const byLabel = new Map<number, Sample[]>();
  for (const s of shuffled(samples, random)) {
    const list = byLabel.get(s.label) ?? [];
    list.push(s);
    byLabel.set(s.label, list);
  }
  return [...byLabel].flatMap(([l, list]) => list.slice(0, l === 0 ? settings.maxNegativeCells : settings.maxCellsPerClass));
}

/**
 * At most `maxPhotos` photos, so training time stays bounded however many a workspace has: each
 * photo weighs the sum of 1 / (regions of its class) over its regions (photos of rare classes
 * first), with a seeded jitter to break ties.
 */
function choosePhotos(examples: readonly TrainingExample[], maxPhotos: number, random: () => number): TrainingExample[] {
  if (examples.length <= maxPhotos) return examples.slice();
  const counts = countRegions(examples);
  const weight = examples.map((e, k) => ({ k, w: e.regions.reduce((sum, r) => sum + 1 / counts.get(r.defect)!, 0) + random() * 1e-9 }));
  return weight
    .sort((a, b) => b.w - a.w)
    .slice(0, maxPhotos)
    .sort((a, b) => a.k - b.k)
    .map(({ k }) => examples[k]);
}

export async function trainModel(offered: readonly TrainingExample[], settings: TrainingSettings): Promise<RegionModel> {
  const random = seededRandom(settings.seed);
  const examples = choosePhotos(offered, settings.maxPhotos, random);
  const steps = plan(examples, settings, random);
  const { defects } = steps;
  const { fitSamples, calibrationSamples, calibration, habits } = await collect(examples, settings, steps, random);

  const grow = settings.trainer === "histogram" ? trainHistogramForest : trainForest;
  const forestOptions = { trees: settings.trees, maxDepth: settings.maxDepth, featureShare: settings.featureShare, minLeafSamples: settings.minLeafSamples, seed: settings.seed };
  const train = (samples: Sample[]) =>
    grow(
      samples.map((s) => s.row),
      samples.map((s) => s.label),
      defects.length + 1,
      forestOptions,
    );
  const fit = capSamples(fitSamples, settings, random);
  let forest = train(fit);

  const specs = specsFrom(habits);
  for (const entry of calibration) entry.scores = scoreActiveCells(entry.photo, (rows) => scoreRows(forest, rows));
  const calibrated = calibrateThresholds(calibration, specs);
  calibrated.forEach((result, c) => result && (specs[c].threshold = result.threshold));

  let stored = fit;
  if (settings.refit && calibration.length > 0) {
    stored = capSamples([...fitSamples, ...calibrationSamples], settings, random);
    forest = train(stored);
  }
  const regionCounts = countRegions(examples);
  const classes: ModelClass[] = defects.map((defect, c) => ({
    defect,
    ...specs[c],
    regions: regionCounts.get(defect) ?? 0,
    photos: habits[c].photos,
    cells: stored.filter((s) => s.label === c + 1).length,
    calibration: calibrated[c] && { regions: calibrated[c].regions, recall: round(calibrated[c].recall), precision: round(calibrated[c].precision) },
  }));
  return {
    format: REGION_MODEL_FORMAT,
    version: REGION_MODEL_VERSION,
    settings,
    features: [...FEATURE_NAMES],
    classes,
    photosOffered: offered.length,
    photos: examples.length,
    calibrationPhotos: calibration.length,
    negativeCells: stored.filter((s) => s.label === 0).length,
    forest,
  };
}
