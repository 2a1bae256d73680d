/**
 * Request shapes of the regions and suggestions API. The region set itself is checked by
 * lib/geometry/validate.ts against the photo's size and the part type's classes (it needs both,
 * so it runs once the photo is known); here only the envelope around it.
 */
import { z } from "zod";

/** A save carries at most 200 000 points (lib/geometry/limits.ts) of up to ~35 bytes of JSON each. */
export const REGION_SAVE_MAX_BYTES = 12 * 1024 * 1024;

export const saveRegionsSchema = z.strictObject({
  baseVersion: z.number({ error: "must be the version number the edit started from" }).int("must be a whole number").min(0, "cannot be negative"),
  regions: z.unknown().refine((value) => value !== undefined, "is missing: send the photo's whole region set"),
});
export type SaveRegionsInput = z.infer<typeof saveRegionsSchema>;

export const SUGGESTION_KINDS = ["surface", "pixel-candidates"] as const;
export type SuggestionKind = (typeof SUGGESTION_KINDS)[number];
export const suggestionSchema = z.strictObject({ kind: z.enum(SUGGESTION_KINDS, { error: 'kind must be "surface" or "pixel-candidates"' }) });
