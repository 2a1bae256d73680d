/**
 * Edits that change many regions at once, each a single undo step: putting another tab's saved
 * set (or a merge of it with this one) in place of the current regions, and adding accepted
 * suggestions. Pure, like model.ts: the same state object comes back when nothing applies.
 */
import { clampShapeToImage } from "@/lib/geometry/clamp";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
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

/**
 * Adds regions with fresh ids as one undo step (accepting suggestions). Shapes are clamped to the
 * photo; a defect of a class the part type does not allow, or a shape that is still invalid, is
 * left out. `ids` lists what was added, in order.
 */
export function addNewRegions(state: AnnotationState, items: readonly NewRegion[]): { state: AnnotationState; ids: RegionId[] } {
  let next = state;
  const added: Region[] = [];
  for (const item of items) {
    if (item.role === "defect" && !state.allowedDefects.includes(item.defect)) continue;
    const allocated = allocateId(next);
    const shape = clampShapeToImage(item.shape, state.image);
    const region: Region = item.role === "defect" ? { id: allocated.id, role: "defect", defect: item.defect, shape } : { id: allocated.id, role: "surface", shape: shape as PolygonShape };
    if (regionProblem(region, state.image)) continue;
    next = allocated.state;
    added.push(region);
  }
  if (added.length === 0) return { state, ids: [] };
  const shown = new Set(added.flatMap((r) => (r.role === "defect" ? [r.defect] : [])));
  const visible = { ...next, hiddenDefects: next.hiddenDefects.filter((d) => !shown.has(d)) };
  return { state: applyEdit(visible, [...next.regions, ...added]), ids: added.map((r) => r.id) };
}
