import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { assertMayRecord, replayOf, type CurrentGrade } from "@/lib/grading/grade-rules";

const current: CurrentGrade = { id: "g-1", finalGrade: "C", gradedByName: "Ines Vale", createdAt: new Date("2026-11-20T09:30:00Z") };
const refusal = (run: () => void) => {
  try {
    run();
  } catch (err) {
    return err instanceof AppError ? [err.status, err.message] : ["not an AppError", String(err)];
  }
  return null;
};

describe("who may add a grade row", () => {
  it("an ungraded unit takes an inspection grade from an inspector or a lead; an override has nothing to replace", () => {
    expect(refusal(() => assertMayRecord({ kind: "inspection" }, null, ["inspector"]))).toBeNull();
    expect(refusal(() => assertMayRecord({ kind: "inspection", expectedCurrentGradeId: null }, null, ["lead"]))).toBeNull();
    expect(refusal(() => assertMayRecord({ kind: "override", reason: "x" }, null, ["lead"]))?.[0]).toBe(409);
    // Naming a grade the unit does not have is a stale view too.
    expect(refusal(() => assertMayRecord({ kind: "inspection", expectedCurrentGradeId: "g-9" }, null, ["inspector"]))?.[0]).toBe(409);
  });

  it("a graded unit takes only a lead's override, with a reason, naming the current grade", () => {
    expect(refusal(() => assertMayRecord({ kind: "inspection" }, current, ["inspector"]))).toEqual([
      409,
      "This unit is already graded (C, recorded by Ines Vale on 2026-11-20 09:30). Only a QC lead can change a recorded grade, with an override that gives a reason and names the grade it replaces.",
    ]);
    expect(refusal(() => assertMayRecord({ kind: "inspection", reason: "lead", expectedCurrentGradeId: "g-1" }, current, ["lead"]))?.[0]).toBe(409);
    expect(refusal(() => assertMayRecord({ kind: "override", reason: "x", expectedCurrentGradeId: "g-1" }, current, ["inspector", "auditor"]))?.[0]).toBe(403);
    expect(refusal(() => assertMayRecord({ kind: "override", expectedCurrentGradeId: "g-1" }, current, ["lead"]))?.[0]).toBe(400);
    expect(refusal(() => assertMayRecord({ kind: "override", reason: "x" }, current, ["lead"]))?.[0]).toBe(400);
    expect(refusal(() => assertMayRecord({ kind: "override", reason: "x", expectedCurrentGradeId: "g-0" }, current, ["lead"]))).toEqual([
      409,
      "The unit's grade changed since you looked: it is now C, recorded by Ines Vale on 2026-11-20 09:30. Review it, then override again if it is still wrong.",
    ]);
    expect(refusal(() => assertMayRecord({ kind: "override", reason: "x", expectedCurrentGradeId: "g-1" }, current, ["lead"]))).toBeNull();
  });
});

describe("a repeated submission", () => {
  const row = { id: "g-2", kind: "override", proposedGrade: "C", finalGrade: "B", overrideReason: "Smudge." };
  it("is answered with the row it made when it asks for the same thing", () => {
    expect(replayOf(row, { kind: "override", decision: "override", finalGrade: "B", reason: "Smudge." })).toBe(row);
    const accepted = { id: "g-3", kind: "inspection", proposedGrade: "A", finalGrade: "A", overrideReason: null };
    expect(replayOf(accepted, { kind: "inspection", decision: "accept" })).toBe(accepted);
  });
  it("is refused (409) when the key was used for another grade, reason or kind", () => {
    expect(() => replayOf(row, { kind: "override", decision: "override", finalGrade: "A", reason: "Smudge." })).toThrow(/already used for a different grade/);
    expect(() => replayOf(row, { kind: "override", decision: "override", finalGrade: "B", reason: "Other." })).toThrow(AppError);
    expect(() => replayOf(row, { kind: "inspection", decision: "accept" })).toThrow(AppError);
  });
});
