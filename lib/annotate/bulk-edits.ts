/**
 * Edits that change many regions at once, each a single undo step: putting another tab's saved
 * set (or a merge of it with this one) in place of the current regions, and adding accepted
 * suggestions. Pure, like model.ts: the same state object comes back when nothing applies.
 */
import { boundsOfShape } from "@/lib/geometry/bounds";
import { clampShapeToImage } from "@/lib/geometry/clamp";
import { hitsShape } from "@/lib/geometry/hit";
import { MAX_REGIONS_PER_PHOTO } from "@/lib/geometry/limits";
import type { Point, PolygonShape, Shape } from "@/lib/geometry/shape";
import { applyEdit, cancelBatch } from "./history";
import { allocateId } from "./model";
import { regionProblem } from "./shape-edits";
import type { AnnotationState, Region, RegionId } from "./types";

/**
 * Replaces every region with `regions` in one undo step, so Ctrl/Cmd+Z brings the previous set
 * back. A drawing or drag in progress is dropped first. Regions that repeat an id, are invalid for
 * this photo, or are a second ruler (one per photo) are left out, not half-applied.
 */
export function replaceAllRegions(state: AnnotationState, regions: readonly Region[]): AnnotationState {
  const ids = new Set<RegionId>();
  let ruler = false;
  const kept: Region[] = [];
  for (const region of regions) {
    if (ids.has(region.id) || regionProblem(region, state.image)) continue;
    if (region.role === "ruler") {
      if (ruler) continue;
      ruler = true;
    }
    ids.add(region.id);
    kept.push(region);
  }
  const base = cancelBatch({ ...state, draft: null, drag: null });
  const selectedId = base.selectedId !== null && ids.has(base.selectedId) ? base.selectedId : null;
  return applyEdit(base, kept, selectedId);
}

export type NewRegion = Readonly<{ role: "defect"; defect: string; shape: Shape }> | Readonly<{ role: "surface"; shape: PolygonShape }>;

/** Why an offered region was left out. */
export type SkipReason = "class" | "invalid" | "duplicate" | "limit";
export type AddOutcome = { state: AnnotationState; ids: RegionId[]; skipped: Record<SkipReason, number> };

/** A defect whose centre lies inside a region of the same class already there (accepted before). */
function repeatsExisting(regions: readonly Region[], item: NewRegion): boolean {
  if (item.role !== "defect") return false;
  const b = boundsOfShape(item.shape);
  const centre: Point = [(b.minX + b.maxX) / 2, (b.minY + b.maxY) / 2];
  return regions.some((r) => r.role === "defect" && r.defect === item.defect && hitsShape(r.shape, centre, 0));
}

/**
 * Adds regions with fresh ids as one undo step (accepting suggestions). Shapes are clamped to the
 * photo. Left out, and counted in `skipped` by reason: a defect of a class the part type does not
 * allow, a shape that is still invalid, a defect whose centre lies in a region of its class that
 * is already there, and anything beyond the photo's region limit. `ids` lists what was added.
 */
export function addNewRegions(state: AnnotationState, items: readonly NewRegion[]): AddOutcome {
  let next = state;
  const added: Region[] = [];
  const skipped: Record<SkipReason, number> = { class: 0, invalid: 0, duplicate: 0, limit: 0 };
  for (const item of items) {
    if (item.role === "defect" && !state.allowedDefects.includes(item.defect)) {
      skipped.class++;
      continue;
    }
    if (repeatsExisting([...state.regions, ...added], item)) {
      skipped.duplicate++;
      continue;
    }
    if (state.regions.length + added.length >= MAX_REGIONS_PER_PHOTO) {
      skipped.limit++;
      continue;
    }
    const allocated = allocateId(next);
    const shape = clampShapeToImage(item.shape, state.image);
    const region: Region = item.role === "defect" ? { id: allocated.id, role: "defect", defect: item.defect, shape } : { id: allocated.id, role: "surface", shape: shape as PolygonShape };
    if (regionProblem(region, state.image)) {
      skipped.invalid++;
      continue;
    }
    next = allocated.state;
    added.push(region);
  }
  if (added.length === 0) return { state, ids: [], skipped };
  const shown = new Set(added.flatMap((r) => (r.role === "defect" ? [r.defect] : [])));
  const visible = { ...next, hiddenDefects: next.hiddenDefects.filter((d) => !shown.has(d)) };
  return { state: applyEdit(visible, [...next.regions, ...added]), ids: added.map((r) => r.id), skipped };
}

const SKIP_TEXT: Record<SkipReason, (n: number) => string> = {
  duplicate: (n) => `${n} repeat${n === 1 ? "s a region" : " regions"} of the same class already marked there`,
  class: (n) => `${n} ${n === 1 ? "is" : "are"} of a class this part type does not have`,
  invalid: (n) => `${n} ${n === 1 ? "is" : "are"} too small or outside the photo`,
  limit: (n) => `${n} would pass the photo's limit of ${MAX_REGIONS_PER_PHOTO.toLocaleString("en-GB")} regions`,
};

/** "Accepted 11 of 12: 1 repeats a region of the same class already marked there." */
export function describeAddOutcome(outcome: Pick<AddOutcome, "ids" | "skipped">, offered: number): string {
  const reasons = (Object.keys(SKIP_TEXT) as SkipReason[]).filter((r) => outcome.skipped[r] > 0).map((r) => SKIP_TEXT[r](outcome.skipped[r]));
  const head = `Accepted ${outcome.ids.length} of ${offered}`;
  return reasons.length === 0 ? `${head}.` : `${head}: ${reasons.join("; ")}.`;
}
