/**
 * The demo's learned-suggestion model, so a newcomer's Bench shows learned ghosts at once. The
 * demo's history has no graded photos (db/seed/lots.ts) and its gallery holds one or two examples
 * per class, far below the suggestion rule (30 regions of a class on 10 photos), so the seed
 * trains on synthetic photos it renders itself, with the same train-and-judge step the training
 * job runs, and stores the result as version 1, in use:
 * - defect-photos.ts photos 0–39 (planted scratches, stains and cracks on six housings), and
 *   three photos of each demo part view that carries a scratch or stain on the Bench (photos.ts's
 *   plantedDefects, other seeds), with every planted mark labelled: without them, dust specks,
 *   swelling or dead pixels beside a scratch hid it from the model. Those other classes are
 *   learned from too few regions to be suggested, as the rule says;
 * - judged on defect photos 500–515, which it never learned from.
 * Its sources say so (`syntheticPhotos`; `acceptedRegions` is the workspace's count at seed time,
 * so the scheduled check waits for that many plus RETRAIN_AFTER_NEW_REGIONS). A real training
 * replaces it only when it is not worse on the workspace's own held-out photos, and never with
 * a model that may suggest nothing on a tie (lib/imaging/learned-eval.ts). Crack,
 * drawn as thin Lines, stays below the rule's held-out recall here, so scratch and stain are
 * suggested. Cost: about 70 s under heavy load on this 2-core machine (rendering 74 photos ~27 s,
 * training ~34 s, judging); less on an idle one. Invented data, demo only.
 */
import { eq } from "drizzle-orm";
import { db, transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { acceptedRegionTotals, insertModel } from "@/db/queries/suggestions";
import { workspaces } from "@/db/schema";
import { trainAndJudge } from "@/lib/suggestions/train-and-judge";
import { ACCEPTED_UNIT_STATUSES } from "@/lib/suggestions/training-set";
import { renderDefectPhotos } from "./defect-photos";
import { renderAnnotatedPartPhoto, type AnnotatedPartPhoto } from "./photo-art";
import { classKeyOf } from "./photo-defects";
import { plantedDefects } from "./photos";

const TRAIN_PHOTOS = 40;
const TEST_PHOTOS = 16;
/** Far from the training photos' numbers, so the two sets never share a photo. */
const FIRST_TEST_PHOTO = 500;
const WIDTH = 960;
/** Demo part views whose Bench photos carry a scratch or stain (photos.ts), as part kind and view. */
const BENCH_VIEWS = [
  ["rear-camera camera", "front"],
  ["battery battery", "back"],
  ["display display", "front"],
  ["housing housing", "front"],
  ["housing housing", "back"],
  ["button-flex flex", "connector"],
] as const;
const PER_BENCH_VIEW = 3;

async function benchLikePhotos(): Promise<AnnotatedPartPhoto[]> {
  const photos: AnnotatedPartPhoto[] = [];
  for (const [k, [kind, viewKey]] of BENCH_VIEWS.entries()) {
    for (let s = 0; s < PER_BENCH_VIEW; s++)
      photos.push(await renderAnnotatedPartPhoto({ kind, viewKey, defects: plantedDefects(kind, viewKey), seed: 90_001 + k * 101 + s * 7, width: WIDTH, height: (WIDTH * 3) / 4 }));
  }
  return photos;
}

// Regions under the part types' class keys, so the model's classes are the workspace's own.
const asPhoto = (p: AnnotatedPartPhoto) => ({ image: p.jpeg, width: p.width, height: p.height, regions: p.regions.map((r) => ({ ...r, defect: classKeyOf(r.defect) })), surface: [p.surface] });

export async function seedSuggestionModel({ workspaceSlug = "vellmoor" }: { workspaceSlug?: string } = {}): Promise<{ version: number; suggests: string[]; seconds: number } | null> {
  const started = performance.now();
  const [ws] = await db().select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.slug, workspaceSlug));
  if (!ws) return null;
  const train = [...(await renderDefectPhotos(0, TRAIN_PHOTOS, WIDTH)), ...(await benchLikePhotos())];
  const test = await renderDefectPhotos(FIRST_TEST_PHOTO, TEST_PHOTOS, WIDTH);
  const result = await trainAndJudge({ train: train.map(asPhoto), test: test.map(asPhoto), current: null });
  const suggests = result.candidate.suggestable.filter((c) => c.suggest).map((c) => c.defect);
  // The workspace's accepted regions now (the gallery's): the scheduled check counts new ones from
  // here, so it does not retrain on the same few regions minutes after the seed.
  const acceptedNow = (await acceptedRegionTotals(ACCEPTED_UNIT_STATUSES)).find((t) => t.workspaceId === ws.id)?.accepted ?? 0;
  const row = await transaction(async (tx) => {
    const stored = await insertModel(
      tx,
      ws.id,
      {
        model: result.model,
        classCounts: Object.fromEntries(result.model.classes.map((c) => [c.defect, { regions: c.regions, photos: c.photos }])),
        sources: { unitPhotos: 0, galleryPhotos: 0, dismissalPhotos: 0, testPhotos: test.length, acceptedRegions: acceptedNow, syntheticPhotos: train.length },
        evaluation: result.candidate.evaluation,
        suggestable: [...result.candidate.suggestable],
        decision: `Demo model trained by the seed on ${train.length} synthetic photos. ${result.decision}`,
        trainingMs: result.trainingMs,
        requestedBy: null,
      },
      result.switchIn,
    );
    await logActivity(tx, {
      workspaceId: ws.id,
      actorId: null,
      action: "suggestions.model_switched_in",
      subjectType: "suggestion_model",
      subjectId: stored.id,
      detail: { version: stored.version, decision: "demo seed", demo: true },
    });
    return stored;
  });
  const seconds = Math.round((performance.now() - started) / 100) / 10;
  console.log(
    `Demo learned-suggestion model: version ${row.version}, suggests ${suggests.join(" and ") || "no class"} (trained on ${train.length} synthetic photos, judged on ${test.length}; ${seconds} s).`,
  );
  return { version: row.version, suggests, seconds };
}
