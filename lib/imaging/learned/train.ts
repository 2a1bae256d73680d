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

export async function trainModel(examples: readonly TrainingExample[], settings: TrainingSettings): Promise<RegionModel> {
  const random = seededRandom(settings.seed);
  const regionCounts = new Map<string, number>();
  for (const e of examples) for (const r of e.regions) regionCounts.set(r.defect, (regionCounts.get(r.defect) ?? 0) + 1);
  const defects = [...regionCounts].filter(([, n]) => n >= settings.minRegionsPerClass).map(([d]) => d).sort();
  if (defects.length === 0) throw new RangeError(`No defect class has ${settings.minRegionsPerClass} or more accepted regions to learn from.`);
  // Forest labels: 0 = no defect, k + 1 = defects[k]. Mask class indices are the forest labels.
  const label = new Map(defects.map((d, k) => [d, k + 1]));

  const withRegions = examples.map((e, k) => [e, k] as const).filter(([e]) => e.regions.some((r) => label.has(r.defect))).map(([, k]) => k);
  const wanted = Math.min(settings.maxCalibrationPhotos, Math.floor(withRegions.length * settings.calibrationShare));
  const calibrationSet = new Set(shuffled(withRegions, random).slice(0, wanted >= 1 && withRegions.length >= 4 ? wanted : 0));
  const fitIndices = examples.map((_, k) => k).filter((k) => !calibrationSet.has(k));

  const photosWith = (defect: string, among: number[]) => among.filter((k) => examples[k].regions.some((r) => r.defect === defect)).length;
  // 1.5 × the even share, trimmed to the cap at the end, so photos with few cells of a class leave room for others.
  const quota = (among: number[]) => new Map(defects.map((d) => [label.get(d)!, Math.ceil((1.5 * settings.maxCellsPerClass) / Math.max(1, photosWith(d, among)))]));
  const negativeQuota = (among: number[]) => Math.ceil((1.5 * settings.maxNegativeCells) / Math.max(1, among.length));
  const fitQuota = quota(fitIndices);
  const allIndices = examples.map((_, k) => k);
  const allQuota = quota(allIndices);


  const fitSamples: Sample[] = [];
  const calibrationSamples: Sample[] = [];
  const calibration: CalibrationPhoto[] = [];
  const drawn = defects.map(() => ({ line: [] as number[], spot: [] as number[], outline: 0, cells: [] as number[], photos: 0 }));
  await eachWithPrefetch(
    allIndices,
    (k) => preparePhoto(examples[k].image, examples[k].surface, settings.workingSide, settings.cellSize),
    (photo, k) => {
      const { shapes, masks } = workingRegions(photo, examples[k].regions, label);
      const cellPx = settings.cellSize ** 2;
      shapes.forEach((s, r) => {
        const habit = drawn[s.classIndex - 1];
        if (s.shape.kind === "line") habit.line.push(s.shape.width);
        else if (s.shape.kind === "spot") habit.spot.push(s.shape.radius);
        else habit.outline++;
        habit.cells.push(countSpans(masks[r].spans) / cellPx);
      });
      for (const c of new Set(shapes.map((s) => s.classIndex - 1))) drawn[c].photos++;
      const inCalibration = calibrationSet.has(k);
      const picked = pickCells(photo.grid, labelCells(photo.grid, masks, photo.inside), inCalibration ? allQuota : fitQuota, negativeQuota(inCalibration ? allIndices : fitIndices), random);
      const rows = featureRows(photo.grid, picked.map(([cell]) => cell));
      (inCalibration ? calibrationSamples : fitSamples).push(...rows.map((row, r) => ({ row, label: picked[r][1] })));
      if (inCalibration) calibration.push({ photo, scores: [], truth: shapes.map((s) => ({ classIndex: s.classIndex - 1, shape: s.shape })) });
    },
  );
  const cap = (samples: Sample[]) => {
    const byLabel = new Map<number, Sample[]>();
    for (const s of shuffled(samples, random)) {
      const list = byLabel.get(s.label) ?? [];
      list.push(s);
      byLabel.set(s.label, list);
    }
    return [...byLabel].flatMap(([l, list]) => list.slice(0, l === 0 ? settings.maxNegativeCells : settings.maxCellsPerClass));
  };
  const forestOptions = { trees: settings.trees, maxDepth: settings.maxDepth, featureShare: settings.featureShare, minLeafSamples: settings.minLeafSamples, seed: settings.seed };
  const grow = settings.trainer === "histogram" ? trainHistogramForest : trainForest;
  const train = (samples: Sample[]) => grow(samples.map((s) => s.row), samples.map((s) => s.label), defects.length + 1, forestOptions);
  const fit = cap(fitSamples);
  let forest = train(fit);

  const specs: ClassProposalSpec[] = drawn.map((habit) => {
    const kind: ShapeKindForClass = habit.line.length >= Math.max(habit.spot.length, habit.outline) ? "line" : habit.spot.length > habit.outline ? "spot" : "outline";
    const smallest = percentile(habit.cells, 0.1, 1);
    return { kind, threshold: DEFAULT_THRESHOLD, lineWidth: percentile(habit.line, 0.5, 4), spotRadius: percentile(habit.spot, 0.5, 2), minCells: Math.max(1, Math.round(MIN_CELLS_SHARE * smallest)) };
  });
  for (const entry of calibration) entry.scores = scoreActiveCells(entry.photo, (rows) => scoreRows(forest, rows));
  const calibrated = calibrateThresholds(calibration, specs);
  calibrated.forEach((result, c) => result && (specs[c].threshold = result.threshold));

  const all = cap([...fitSamples, ...calibrationSamples]);
  if (settings.refit && calibration.length > 0) forest = train(all);

  const classes: ModelClass[] = defects.map((defect, c) => ({
    defect,
    ...specs[c],
    regions: regionCounts.get(defect) ?? 0,
    photos: drawn[c].photos,
    cells: all.filter((s) => s.label === c + 1).length,
    calibration: calibrated[c] && { regions: calibrated[c].regions, recall: round(calibrated[c].recall), precision: round(calibrated[c].precision) },
  }));
  return {
    format: REGION_MODEL_FORMAT,
    version: REGION_MODEL_VERSION,
    settings,
    features: [...FEATURE_NAMES],
    classes,
    photos: examples.length,
    calibrationPhotos: calibration.length,
    negativeCells: all.filter((s) => s.label === 0).length,
    forest,
  };
}
