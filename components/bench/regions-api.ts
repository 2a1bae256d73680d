/**
 * The Bench's calls to the regions and suggestions API. A save's outcome is sorted for the
 * autosaver: saved, a version conflict (with the server's current set), worth retrying (offline,
 * server trouble), or refused with the server's sentence.
 */
import type { SuggestionKind } from "@/lib/regions/schemas";
import type { SuggestionResponse } from "@/lib/regions/suggestion-mapping";
import { apiFetch } from "@/lib/http/client";
import type { LearnedSuggestionResponse } from "@/lib/suggestions/dto";
import type { DecisionsInput } from "@/lib/suggestions/schemas";
import type { SaveRequest, SendResult, ServerSet } from "./region-autosaver";

export type RegionSetJson = ServerSet & { photoId: string; updatedAt: string | null; updatedByName: string | null };

const OFFLINE = "The server cannot be reached (offline?). Your edits are kept here and saved as soon as it answers.";

export function fetchRegionSet(photoId: string, signal?: AbortSignal): Promise<RegionSetJson> {
  return apiFetch<RegionSetJson>(`/api/photos/${photoId}/regions`, { signal });
}

export function putRegionSet(photoId: string, request: SaveRequest): Promise<SendResult> {
  return putRegionSetAt(`/api/photos/${photoId}/regions`, request);
}

/** PUT a region set to `url` (a photo's regions, or an auditor's own set on a recheck) and sort the outcome. */
export async function putRegionSetAt(url: string, request: SaveRequest & { photoId?: string }): Promise<SendResult> {
  let res: Response;
  try {
    res = await fetch(url, { method: "PUT", headers: { "Content-Type": "application/json" }, body: JSON.stringify(request) });
  } catch {
    return { kind: "retryable", message: OFFLINE };
  }
  const body = (await res.json().catch(() => null)) as (RegionSetJson & { error?: { message?: string }; current?: RegionSetJson }) | null;
  if (res.ok && body) return { kind: "saved", set: body };
  const message = body?.error?.message ?? `The server answered ${res.status}.`;
  if (res.status === 409 && body?.current) return { kind: "conflict", current: body.current, message };
  if (res.status >= 500 || res.status === 429 || res.status === 408 || !body)
    return { kind: "retryable", message: res.status >= 500 ? `The server had a problem (${res.status}); saving again shortly.` : message };
  if (res.status === 401) return { kind: "refused", message: "Your session has ended. Sign in again in another tab, then press Try again: your edits are kept here." };
  return { kind: "refused", message };
}

export function requestSuggestions(photoId: string, kind: SuggestionKind): Promise<SuggestionResponse> {
  return apiFetch<SuggestionResponse>(`/api/photos/${photoId}/suggestions`, { body: { kind } });
}

export function requestLearnedSuggestions(photoId: string): Promise<LearnedSuggestionResponse> {
  return apiFetch<LearnedSuggestionResponse>(`/api/photos/${photoId}/learned-suggestions`, { body: {} });
}

export function recordSuggestionDecisions(photoId: string, input: DecisionsInput): Promise<{ recorded: number }> {
  return apiFetch<{ recorded: number }>(`/api/photos/${photoId}/suggestion-decisions`, { body: input });
}
