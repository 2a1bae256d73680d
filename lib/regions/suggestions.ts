import "server-only";
/**
 * Suggestions for the Bench: a Surface outline (Otsu on the preview derivative) or pixel-fault
 * candidates (on the original, screen views of display parts only, inside the active screen area:
 * lib/regions/screen-area.ts), as ghost shapes in original pixels. Nothing is stored: an accepted
 * ghost becomes a region through the normal save.
 * The image work runs in a compute thread (lib/compute/pool.ts), never on the request's thread,
 * with a few at a time per kind (a further request answers 503 "busy" at once), decoding capped
 * at the size the photo's row records, and a hard time limit: past it the thread is ended and
 * the request answers 503, so the inspector marks by hand or tries again.
 */
import type { SessionUser } from "@/lib/auth/require-user";
import { runInThread } from "@/lib/compute/pool";
import { AppError } from "@/lib/errors";
import { getObjectBuffer, objectStore } from "@/lib/storage/s3";
import { loadPhotoForRegions, readRegionSet } from "./regions";
import { screenSearchArea } from "./screen-area";
import type { SuggestionKind } from "./schemas";
import { candidateGhosts, isScreenView, scalePolygon, type SuggestionResponse } from "./suggestion-mapping";

export const SUGGESTION_TIME_LIMIT_MS: Record<SuggestionKind, number> = { surface: 8_000, "pixel-candidates": 20_000 };
/** Pixel candidates reads the full original: refuse what would not fit the time limit anyway. */
const MAX_CANDIDATE_PIXELS = 50_000_000;
/** The preview derivative's long edge is at most 2 560 px (lib/imaging/normalize.ts). */
const MAX_PREVIEW_PIXELS = 2560 * 2560;

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
    const limitInputPixels = Math.min(MAX_PREVIEW_PIXELS, (photo.previewWidth ?? 2560) * (photo.previewHeight ?? 2560));
    const found = await runInThread("suggest-surface", { image: preview, options: { limitInputPixels } }, { timeoutMs: SUGGESTION_TIME_LIMIT_MS.surface });
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
  // Decode no more pixels than the photo's row records: a swapped object cannot be bigger.
  const options = { maxCandidates: 200, limitInputPixels: original.width * original.height, area: screen.area };
  const result = await runInThread("pixel-candidates", { image: bytes, options }, { timeoutMs: SUGGESTION_TIME_LIMIT_MS["pixel-candidates"] });
  const { ghosts, withoutClass } = candidateGhosts(result.candidates, partType.defectClasses, original);
  const parts = [`${ghosts.length} candidate${ghosts.length === 1 ? "" : "s"} found ${screen.description}.`];
  if (result.droppedNearEdge) parts.push(`${result.droppedNearEdge} more at the panel's edge ${result.droppedNearEdge === 1 ? "was" : "were"} left out.`);
  if (withoutClass) parts.push(`${withoutClass} more are of a class this part type does not have.`);
  if (result.truncated) parts.push("More were found; only the strongest 200 are shown.");
  if (result.largeGroups) parts.push(`${result.largeGroups} larger blotch${result.largeGroups === 1 ? " was" : "es were"} left out (not pixel-sized: check for smudges or clouding).`);
  return { kind, ghosts, note: parts.join(" ") };
}
