/**
 * Rubric versioning rules and measurement staleness (the task's stated semantics, no outside
 * computation involved).
 */
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import type { Rubric } from "@/lib/grading/rubric-schema";
import { checklistStampOf, measurementStaleness } from "@/lib/grading/staleness";
import { assertEditable, gradingVersion, latestPublished, nextVersionNumber, planDraft, type VersionRow } from "@/lib/grading/versioning";

const rubric = (threshold: number): Rubric => ({ rules: [{ id: "r", metric: "count", defect: "dent", comparison: ">", threshold, grade: "B" }] });
const v = (version: number, status: VersionRow["status"], threshold = version): VersionRow => ({ version, status, rubric: rubric(threshold) });

describe("rubric versioning", () => {
  it("numbers versions 1, 2, 3 … after the highest existing one", () => {
    expect(nextVersionNumber([])).toBe(1);
    expect(nextVersionNumber([v(2, "published"), v(1, "published")])).toBe(3);
  });

  it("a new draft copies the latest published version; an existing draft is reused", () => {
    const plan = planDraft([v(1, "published"), v(2, "published")]);
    expect(plan).toEqual({ kind: "new", version: 3, basedOnVersion: 2, rubric: rubric(2) });
    expect(planDraft([v(1, "published"), v(2, "draft")])).toEqual({ kind: "existing", version: 2 });
    expect(planDraft([])).toEqual({ kind: "new", version: 1, basedOnVersion: null, rubric: { rules: [] } });
  });

  it("the draft's copy is independent of the published rubric", () => {
    const published = v(1, "published");
    const plan = planDraft([published]);
    if (plan.kind !== "new") throw new Error("expected a new draft");
    (plan.rubric.rules[0] as { threshold: number }).threshold = 99;
    expect((published.rubric.rules[0] as { threshold: number }).threshold).toBe(1);
  });

  it("only drafts may change", () => {
    expect(() => assertEditable({ version: 3, status: "draft" })).not.toThrow();
    expect(() => assertEditable({ version: 2, status: "published" })).toThrow(/Version 2 is published/);
  });

  it("grades with the latest published version, never a draft", () => {
    const versions = [v(3, "draft"), v(1, "published"), v(2, "published")];
    expect(latestPublished(versions)?.version).toBe(2);
    expect(gradingVersion(versions, "Rear camera").version).toBe(2);
    expect(() => gradingVersion([v(1, "draft")], "Rear camera")).toThrow(AppError);
    expect(() => gradingVersion([v(1, "draft")], "Rear camera")).toThrow(/Rear camera has no published rubric/);
  });
});

describe("measurement staleness", () => {
  const measured = { regionsVersions: { a: 2, b: 5 }, checklistStamp: "2026-12-01T10:00:00.000Z" };
  it("is current when every photo's region version and the checklist stamp are the same", () => {
    expect(measurementStaleness(measured, { regionsVersions: { b: 5, a: 2 }, checklistStamp: "2026-12-01T10:00:00.000Z" })).toEqual({ stale: false, reasons: [] });
  });

  it("is stale when regions changed, a photo was added or removed, or the checklist changed", () => {
    const name = (id: string) => `Photo ${id.toUpperCase()}`;
    expect(measurementStaleness(measured, { regionsVersions: { a: 3, b: 5 }, checklistStamp: measured.checklistStamp }, name).reasons).toEqual([
      "Photo A: regions changed since measuring (version 2 → 3).",
    ]);
    expect(measurementStaleness(measured, { regionsVersions: { a: 2, b: 5, c: 0 }, checklistStamp: measured.checklistStamp }, name).reasons).toEqual(["Photo C was added after measuring."]);
    expect(measurementStaleness(measured, { regionsVersions: { a: 2 }, checklistStamp: measured.checklistStamp }, name).reasons).toEqual(["Photo B was measured but is no longer part of the unit."]);
    expect(measurementStaleness(measured, { regionsVersions: { a: 2, b: 5 }, checklistStamp: null }).reasons).toEqual(["Checklist results changed since measuring."]);
  });

  it("is stale when a photo was filed under another view (its zones change); measurements without views skip that check", () => {
    const withViews = { ...measured, views: { a: "front", b: "back" } };
    const now = { regionsVersions: { a: 2, b: 5 }, checklistStamp: measured.checklistStamp, views: { a: "back", b: "back" } };
    expect(measurementStaleness(withViews, now, (id) => `Photo ${id.toUpperCase()}`).reasons).toEqual(["Photo A: filed under another view since measuring (front → back)."]);
    expect(measurementStaleness(withViews, { ...now, views: { a: "front", b: "back" } }).stale).toBe(false);
    expect(measurementStaleness(measured, now).stale).toBe(false); // measured before views were recorded
  });

  it("normalises checklist stamps from Date and text", () => {
    expect(checklistStampOf(new Date("2026-12-01T10:00:00Z"))).toBe("2026-12-01T10:00:00.000Z");
    expect(checklistStampOf("2026-12-01 11:00:00+01")).toBe("2026-12-01T10:00:00.000Z");
    expect(checklistStampOf(null)).toBeNull();
  });
});
