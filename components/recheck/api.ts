/** The recheck screens' calls and response shapes (the server's DTOs, imported as types). */
import type { AdjudicationView } from "@/lib/recheck/adjudication-view";
import type { BlindRecheckView } from "@/lib/recheck/blind-view";
import { apiFetch } from "@/lib/http/client";
import { EMPTY_PAYLOAD } from "@/lib/regions/payload";

// The server's views are JSON-ready (times as ISO text), so the API's answer has their type.
export type BlindRecheckJson = BlindRecheckView;
export type AdjudicationJson = AdjudicationView;
export type Proposal = { rubricVersion: number; proposal: { grade: "A" | "B" | "C" | "Reject"; lines: { text: string }[]; notes: string[] } };

export const recheckUrls = {
  view: (id: string) => `/api/rechecks/${id}`,
  regions: (id: string) => `/api/rechecks/${id}/regions`,
  measure: (id: string) => `/api/rechecks/${id}/measure`,
  submission: (id: string) => `/api/rechecks/${id}/submission`,
  lease: (id: string) => `/api/rechecks/${id}/lease`,
  adjudication: (id: string) => `/api/rechecks/${id}/adjudication`,
};

/** The auditor's saved set on one photo, fresh from the server (a photo switched back to must not start from an old copy). */
export async function fetchOwnSet(recheckId: string, photoId: string) {
  const view = await apiFetch<BlindRecheckJson>(recheckUrls.view(recheckId));
  return view.regionSets[photoId] ?? { version: 0, regions: EMPTY_PAYLOAD };
}
