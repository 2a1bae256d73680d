/**
 * Steps between grades on the cosmetic scale (our definition, c: positions on A, B, C, Reject).
 */
import { describe, expect, it } from "vitest";
import { gradeAgreement, gradeSteps } from "@/lib/grading/grade-steps";
import type { Grade } from "@/lib/grading/rubric-schema";

describe("gradeSteps / gradeAgreement", () => {
  it("counts positions on A, B, C, Reject in either order", () => {
    expect(gradeSteps("A", "A")).toBe(0);
    expect(gradeSteps("A", "B")).toBe(1);
    expect(gradeSteps("C", "Reject")).toBe(1);
    expect(gradeSteps("Reject", "A")).toBe(3);
    expect(gradeSteps("B", "Reject")).toBe(2);
  });

  it("names same / one step / further", () => {
    expect(gradeAgreement("B", "B")).toBe("same");
    expect(gradeAgreement("C", "B")).toBe("one_step");
    expect(gradeAgreement("A", "C")).toBe("further");
  });

  it("refuses something that is not a grade", () => {
    expect(() => gradeSteps("A", "D" as Grade)).toThrow(/"D" is not a grade/);
  });
});
