/**
 * Learned suggestions (lib/imaging/learned.ts) on synthetic part photos with planted scratches,
 * cracks and stains (db/seed/defect-photos.ts, 1 280 × 960 JPEGs), printing:
 * - training time for about 1 000 accepted regions (target <= 30 s on 2 cores; at most
 *   `maxPhotos` = 120 of the photos are decoded), the model's size;
 * - held-out recall and precision per class at IoU >= 0.3 on 40 photos the model never saw;
 * - suggestion time per 12 MP photo (4 000 × 3 000 JPEG; target <= 1 s), median of 5;
 * - the histogram forest against ml-random-forest on the same 40 training photos (time, figures).
 * Wall-clock figures depend on what else runs: the load average is printed before and after.
 * Run: npx tsx bench/learned.ts   (renders ~350 photos first: about a minute of CPU)
 */
import { loadavg } from "node:os";
import { renderDefectPhoto, renderDefectPhotos } from "@/db/seed/defect-photos";
import type { AnnotatedPartPhoto } from "@/db/seed/photo-art";
import { suggestRegions, trainRegionModel, type RegionModel, type TrainingOptions } from "@/lib/imaging/learned";
import { evaluateRegionModel } from "@/lib/imaging/learned-eval";

const TARGET_REGIONS = 1000;
const cpuSeconds = () => {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1e6;
};
const load = () =>
  loadavg()
    .map((v) => v.toFixed(1))
    .join(" ");
const asExample = (p: AnnotatedPartPhoto) => ({ image: p.jpeg, regions: p.regions, surface: [p.surface] });

async function timedTraining(photos: AnnotatedPartPhoto[], options: TrainingOptions = {}) {
  const [wall, cpu] = [performance.now(), cpuSeconds()];
  const model = await trainRegionModel(photos.map(asExample), options);
  return { model, wallS: (performance.now() - wall) / 1000, cpuS: cpuSeconds() - cpu };
}

async function heldOut(model: RegionModel, photos: AnnotatedPartPhoto[]): Promise<string> {
  const evaluation = await evaluateRegionModel(
    model,
    photos.map((p) => ({ image: p.jpeg, width: p.width, height: p.height, regions: p.regions, surface: [p.surface] })),
  );
  return Object.entries(evaluation.byClass)
    .map(([defect, f]) => `${defect} recall ${f.recall.toFixed(2)} (${f.hits}/${f.accepted}) precision ${f.precision.toFixed(2)} (${f.hits}/${f.suggested})`)
    .join("; ");
}

console.log(`load average before: ${load()}`);
const training: AnnotatedPartPhoto[] = [];
for (let first = 0; training.reduce((n, p) => n + p.regions.length, 0) < TARGET_REGIONS; first += 20) training.push(...(await renderDefectPhotos(first, 20)));
const test = await renderDefectPhotos(1000, 40);
const regions = training.reduce((n, p) => n + p.regions.length, 0);

const big = await timedTraining(training);
console.log(
  `training on ${regions} regions in ${training.length} photos (${big.model.photos} used): ${big.wallS.toFixed(1)} s wall, ${big.cpuS.toFixed(1)} s CPU ` +
    `(target <= 30 s); model JSON ${(JSON.stringify(big.model).length / 1024).toFixed(0)} KiB, ` +
    big.model.classes.map((c) => `${c.defect} ${c.cells} cells, threshold ${c.threshold}`).join(", "),
);
console.log(`held-out (${test.length} photos, IoU >= 0.3): ${await heldOut(big.model, test)}`);

const photo12mp = await renderDefectPhoto(2000, 4000);
const times: number[] = [];
let found = 0;
for (let run = 0; run < 5; run++) {
  const started = performance.now();
  found = (await suggestRegions(big.model, photo12mp.jpeg, { surface: [photo12mp.surface] })).length;
  times.push(performance.now() - started);
}
times.sort((a, b) => a - b);
console.log(
  `suggestions on a ${photo12mp.width} × ${photo12mp.height} JPEG (${(photo12mp.jpeg.length / 1e6).toFixed(1)} MB): median ${times[2].toFixed(0)} ms, min ${times[0].toFixed(0)} ms (target <= 1 000 ms), ${found} suggestions`,
);

// The same 40 training photos and forest size for both trainers; ml-random-forest gets a sample it
// can train on in minutes (its split search grows with the square of the sample).
const small = training.slice(0, 40);
const shared = { trees: 15, refit: false } as const;
for (const [name, options] of [
  ["histogram forest", shared],
  ["ml-random-forest", { ...shared, trainer: "ml-random-forest", maxCellsPerClass: 200, maxNegativeCells: 500 }],
] as const) {
  const run = await timedTraining(small, options);
  console.log(`${name} on 40 photos: ${run.wallS.toFixed(1)} s wall, ${run.cpuS.toFixed(1)} s CPU; held-out: ${await heldOut(run.model, test)}`);
}
console.log(`load average after: ${load()}`);
