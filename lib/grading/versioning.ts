/**
 * The rules of rubric versions, as plain functions over version rows:
 * - versions of a part type are numbered 1, 2, 3 … in order of creation;
 * - at most one draft per part type; a new draft copies the latest version (the draft itself
 *   if one exists, else the latest published one);
 * - only a draft may change; publishing freezes it for good;
 * - units are graded by the latest **published** version; a draft never grades anything.
 */
import { AppError } from "@/lib/errors";
import type { Rubric } from "./rubric-schema";

export type VersionRow = { version: number; status: "draft" | "published"; rubric: Rubric };

export const EMPTY_RUBRIC: Rubric = { rules: [] };

export function nextVersionNumber(versions: readonly Pick<VersionRow, "version">[]): number {
  return versions.reduce((max, row) => Math.max(max, row.version), 0) + 1;
}

export function findDraft<T extends Pick<VersionRow, "status">>(versions: readonly T[]): T | undefined {
  return versions.find((row) => row.status === "draft");
}

export function latestPublished<T extends Pick<VersionRow, "status" | "version">>(versions: readonly T[]): T | undefined {
  return versions.filter((row) => row.status === "published").reduce<T | undefined>((best, row) => (!best || row.version > best.version ? row : best), undefined);
}

/** What opening a draft does: keep the existing draft, or copy the latest published rubric. */
export function planDraft(versions: readonly VersionRow[]): { kind: "existing"; version: number } | { kind: "new"; version: number; basedOnVersion: number | null; rubric: Rubric } {
  const draft = findDraft(versions);
  if (draft) return { kind: "existing", version: draft.version };
  const source = latestPublished(versions);
  return { kind: "new", version: nextVersionNumber(versions), basedOnVersion: source?.version ?? null, rubric: structuredClone(source?.rubric ?? EMPTY_RUBRIC) };
}

/** Throws 409 unless the row is a draft (published versions are frozen). */
export function assertEditable(row: Pick<VersionRow, "status" | "version">): void {
  if (row.status !== "draft") {
    throw new AppError("conflict", `Version ${row.version} is published and can no longer change. Open a new draft to make changes.`);
  }
}

/** The rubric that grades new measurements; 409 when nothing has been published yet. */
export function gradingVersion<T extends Pick<VersionRow, "status" | "version">>(versions: readonly T[], partTypeName: string): T {
  const published = latestPublished(versions);
  if (!published) {
    throw new AppError("conflict", `${partTypeName} has no published rubric yet, so its units cannot be graded. A QC lead must publish one on the Rubrics screen.`);
  }
  return published;
}
