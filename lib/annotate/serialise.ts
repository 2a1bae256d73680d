/**
 * Between the editor state and the region-set payload the save route validates with
 * lib/geometry/validate.ts (`regionSetSchema`): defect regions, surfaces and the one ruler go in
 * separate lists, so each can be checked by its own rules and fed to measureCoverage as is.
 */
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { AnnotationState, Region } from "./types";

export function toRegionSetPayload(state: Pick<AnnotationState, "regions">): RegionSetPayload {
  const payload: RegionSetPayload = { regions: [], surfaces: [], ruler: null };
  for (const region of state.regions) {
    if (region.role === "defect") payload.regions.push({ id: region.id, defect: region.defect, shape: region.shape });
    else if (region.role === "surface") payload.surfaces.push({ id: region.id, shape: region.shape });
    else payload.ruler = { id: region.id, ...region.ruler };
  }
  return payload;
}

/**
 * Regions for createAnnotationState from a saved (validated) payload: surfaces first so they sit
 * under the defects, then defects in their saved order, then the ruler.
 */
export function regionsFromPayload(payload: RegionSetPayload): Region[] {
  const regions: Region[] = payload.surfaces.map((s) => ({ id: s.id, role: "surface", shape: s.shape }));
  for (const r of payload.regions) regions.push({ id: r.id, role: "defect", defect: r.defect, shape: r.shape });
  if (payload.ruler) {
    const { id, a, b, lengthMm } = payload.ruler;
    regions.push({ id, role: "ruler", ruler: { a, b, lengthMm } });
  }
  return regions;
}
