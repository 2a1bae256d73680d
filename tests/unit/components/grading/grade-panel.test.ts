import { describe, expect, it } from "vitest";
import { offeredGradesSentence } from "@/components/grading/grade-panel";

describe("the override form's grade message", () => {
  it("never names a grade the form does not offer", () => {
    // Issue 15: with Reject proposed (and so not offered), the error said "must be A, B, C or Reject".
    expect(offeredGradesSentence("Reject")).toBe("Choose the final grade: A, B or C.");
    expect(offeredGradesSentence("C")).toBe("Choose the final grade: A, B or Reject.");
    expect(offeredGradesSentence("A")).toBe("Choose the final grade: B, C or Reject.");
  });
});
