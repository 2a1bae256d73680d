import "server-only";
/**
 * Suggestions for the Bench: a Surface outline (Otsu on the preview derivative) or pixel-fault
 * candidates (on the original, screen views of display parts only, inside the active screen area:
 * lib/regions/screen-area.ts), as ghost shapes in original pixels. Nothing is stored: an accepted ghost becomes a region through the normal save.
 * Time-bounded: past the limit the request answers 503 and the inspector marks by hand (the
 * image work itself cannot be interrupted; it finishes in the background and is discarded).
 */
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError } from "@/lib/errors";
import { suggestPixelCandidates } from "@/lib/imaging/pixel-candidates";
import { suggestSurface } from "@/lib/imaging/suggest-surface";
import { getObjectBuffer, objectStore } from "@/lib/storage/s3";
import { loadPhotoForRegions, readRegionSet } from "./regions";
import { screenSearchArea } from "./screen-area";
import type { SuggestionKind } from "./schemas";
import { candidateGhosts, isScreenView, scalePolygon, type SuggestionResponse } from "./suggestion-mapping";

export const SUGGESTION_TIME_LIMIT_MS: Record<SuggestionKind, number> = { surface: 8_000, "pixel-candidates": 20_000 };
/** Pixel candidates reads the full original: refuse what would not fit the time limit anyway. */
const MAX_CANDIDATE_PIXELS = 50_000_000;

async function withinTime<T>(work: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const late = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new AppError("unavailable", `${what} took longer than ${Math.round(ms / 1000)} s and was stopped. Mark the regions by hand, or try again.`)), ms);
  });
  try {
    return await Promise.race([work, late]);
  } finally {
    clearTimeout(timer);
  }
}

async function objectBytes(key: string | null): Promise<Buffer> {
  const bytes = key ? await getObjectBuffer(objectStore(), key) : null;
  if (!bytes) throw new AppError("conflict", "This photo's image is missing from the photo store, so nothing can be suggested.");
  return bytes;
}

export async function suggestForPhoto(actor: Pick<SessionUser, "id" | "workspaceId" | "roles">, photoId: string, kind: SuggestionKind): Promise<SuggestionResponse> {
  const context = await loadPhotoForRegions(actor, photoId);
  const { photo, partType } = context;
  if (photo.status !== "ready" || !photo.width || !photo.height) throw new AppError("conflict", "This photo is still being processed; suggestions need the finished photo.");
  const original = { width: photo.width, height: photo.height };

  if (kind === "surface") {
    const preview = await objectBytes(photo.previewKey);
    const found = await withinTime(suggestSurface(preview), SUGGESTION_TIME_LIMIT_MS.surface, "Finding the Surface");
    if (!found.shape) return { kind, ghosts: [], note: `No Surface could be suggested: ${found.note}` };
    const from = { width: photo.previewWidth ?? original.width, height: photo.previewHeight ?? original.height };
    const shape = scalePolygon(found.shape, from, original);
    return { kind, ghosts: [{ id: "surface-1", role: "surface", shape, label: `Suggested Surface (${found.confidence} confidence)` }], note: found.note };
  }

  if (!isScreenView(partType, photo.viewKey)) {
    throw new AppError("conflict", "Pixel faults are looked for only on the lit test-screen views (screen-…) of display parts.");
  }
  if (original.width * original.height > MAX_CANDIDATE_PIXELS) throw new AppError("payload_too_large", "This photo is too large to search for pixel faults in time.");
  const { regions } = await readRegionSet(actor, photoId);
  const view = partType.views.find((v) => v.key === photo.viewKey);
  const screen = screenSearchArea({ surfaces: regions.surfaces.map((s) => s.shape), zones: view?.zones ?? [], size: original });
  if ("problem" in screen) throw new AppError("conflict", screen.problem);
  const bytes = await objectBytes(photo.originalKey);
  const result = await withinTime(suggestPixelCandidates(bytes, { maxCandidates: 200, area: screen.area }), SUGGESTION_TIME_LIMIT_MS["pixel-candidates"], "Looking for pixel faults");
  const { ghosts, withoutClass } = candidateGhosts(result.candidates, partType.defectClasses, original);
  const parts = [`${ghosts.length} candidate${ghosts.length === 1 ? "" : "s"} found ${screen.description}.`];
  if (result.droppedNearEdge) parts.push(`${result.droppedNearEdge} more at the panel's edge ${result.droppedNearEdge === 1 ? "was" : "were"} left out.`);
  if (withoutClass) parts.push(`${withoutClass} more are of a class this part type does not have.`);
  if (result.truncated) parts.push("More were found; only the strongest 200 are shown.");
  if (result.largeGroups) parts.push(`${result.largeGroups} larger blotch${result.largeGroups === 1 ? " was" : "es were"} left out (not pixel-sized: check for smudges or clouding).`);
  return { kind, ghosts, note: parts.join(" ") };
}
