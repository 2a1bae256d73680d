/**
 * The team's agreement beyond two raters, on published data put on the grade scale.
 * IRR   Gwet (2014), Handbook of Inter-Rater Reliability: 5 observers × 15 units (categories 0–3,
 *       here A, B, C, Reject), as published in his irrCAC package (`cac.raw5observers`) → AC1 0.497
 *       (a; tests/unit/agreement/multi-rater-proportion.test.ts).
 * REF   docs/references.md: Krippendorff's 3 coders × 15 units (values 1–4, here A, B, C, Reject);
 *       its ordinal alpha 0.806721 is checked by a literal coincidence-matrix computation in
 *       tests/unit/agreement/krippendorff.test.ts (no published ordinal figure; nominal and interval
 *       are published, a).
 */
import { describe, expect, it } from "vitest";
import type { Grade } from "@/lib/grading/rubric-schema";
import { calibrationGradeSets, gradeSetsOf, multiRaterAgreement } from "@/lib/recheck/team";

const SCALE: Grade[] = ["A", "B", "C", "Reject"];

/** Units as the grades they got, from one row per rater; `offset` maps the first value to "A". */
function unitsOf(rows: (number | null)[][], offset: number): Grade[][] {
  return rows[0].map((_, unit) =>
    rows
      .map((row) => row[unit])
      .filter((value): value is number => value !== null)
      .map((value) => SCALE[value - offset]),
  );
}
const row = (text: string) => text.split(" ").map((value) => (value === "." ? null : Number(value)));

const FIVE_OBSERVERS = unitsOf(
  [row("1 1 2 . 0 0 1 1 2 2 . 0 1 3 1"), row("1 1 3 0 0 0 0 . 2 1 1 0 2 3 1"), row("2 0 3 0 0 0 2 2 2 1 0 0 2 2 1"), row(". 1 3 . . . . 0 . 1 0 0 2 2 ."), row("2 . . 0 0 0 1 . 2 . . . . 3 1")],
  0,
);
const THREE_CODERS = unitsOf([row(". . . . . 3 4 1 2 1 1 3 3 . 3"), row("1 . 2 1 3 3 4 3 . . . . . . ."), row(". . 2 1 3 4 4 . 2 1 1 3 3 . 4")], 1);

describe("multiRaterAgreement", () => {
  it("Gwet's 5 observers × 15 units on A–Reject → AC1 0.497 (IRR a)", () => {
    const figures = multiRaterAgreement(FIVE_OBSERVERS);
    expect(Number(figures.ac1.toFixed(3))).toBe(0.497);
    expect(figures.units).toBe(15);
    expect(figures.unitsWithMoreThanTwo).toBe(15);
  });

  it("Krippendorff's 3 coders × 15 units on A–Reject → ordinal alpha 0.806721, units with one grade left out (REF)", () => {
    const figures = multiRaterAgreement(THREE_CODERS);
    expect(Number(figures.alphaOrdinal.toFixed(6))).toBe(0.806721);
    // Units 1 (one grade), 2 (none) and 14 (none) drop out; units 6 and 7 have three grades.
    expect(figures).toMatchObject({ units: 12, unitsWithMoreThanTwo: 2 });
    expect(figures.grades).toBe(THREE_CODERS.reduce((sum, unit) => sum + (unit.length >= 2 ? unit.length : 0), 0));
  });

  it("does not depend on the order of a unit's grades (who is first, recheck or adjudication)", () => {
    const reversed = THREE_CODERS.map((unit) => [...unit].reverse());
    const a = multiRaterAgreement(THREE_CODERS);
    const b = multiRaterAgreement(reversed);
    expect(b.alphaOrdinal).toBeCloseTo(a.alphaOrdinal, 12);
    expect(b.ac1).toBeCloseTo(a.ac1, 12);
  });

  it("with minGrades 3 reads only units graded by more than two people (HAND)", () => {
    // Units [A,A,A] and [A,A,B]: p_a = (1 + 2/6)/2 = 2/3; π_A = (1 + 2/3)/2 = 5/6, π_B = 1/6;
    // p_e = (5/6·1/6 + 1/6·5/6)/3 = 10/108; AC1 = (2/3 − 10/108)/(1 − 10/108) = 62/98.
    const units: Grade[][] = [["A", "A", "A"], ["A", "A", "B"], ["C", "Reject"], ["B"]];
    const figures = multiRaterAgreement(units, { minGrades: 3 });
    expect(figures).toMatchObject({ units: 2, unitsWithMoreThanTwo: 2, grades: 6 });
    expect(figures.ac1).toBeCloseTo(62 / 98, 12);
    expect(multiRaterAgreement(units).units).toBe(3);
    expect(() => multiRaterAgreement(units, { minGrades: 1 })).toThrow(/at least two grades/);
  });

  it("is undefined (NaN) with no unit graded twice, and when every grade is the same alpha is NaN while AC1 is 1", () => {
    const none = multiRaterAgreement([["A"], []]);
    expect(none.units).toBe(0);
    expect(none.alphaOrdinal).toBeNaN();
    expect(none.ac1).toBeNaN();
    const allA = multiRaterAgreement([
      ["A", "A"],
      ["A", "A", "A"],
    ]);
    expect(allA.alphaOrdinal).toBeNaN();
    expect(allA.ac1).toBeCloseTo(1, 12);
  });

  it("counted units give the figures of the units written out (the scorecards pass grade sets with counts)", () => {
    // THREE_CODERS and FIVE_OBSERVERS with each unit repeated 1, 2, 3, … times, against the same units counted.
    for (const data of [THREE_CODERS, FIVE_OBSERVERS]) {
      const counts = data.map((_, index) => (index % 4) + 1);
      const written = multiRaterAgreement(data.flatMap((unit, index) => Array.from({ length: counts[index] }, () => unit)));
      const counted = multiRaterAgreement(data, { counts });
      expect(counted.units).toBe(written.units);
      expect(counted.unitsWithMoreThanTwo).toBe(written.unitsWithMoreThanTwo);
      expect(counted.grades).toBe(written.grades);
      expect(counted.alphaOrdinal).toBeCloseTo(written.alphaOrdinal, 12);
      expect(counted.ac1).toBeCloseTo(written.ac1, 12);
      // And not the figures of the units counted once (the counts change them).
      expect(Math.abs(counted.alphaOrdinal - multiRaterAgreement(data).alphaOrdinal)).toBeGreaterThan(1e-6);
    }
    // A count of 0 leaves the unit out; a count that is not a whole number is refused.
    expect(
      multiRaterAgreement(
        [
          ["A", "B"],
          ["A", "A"],
        ],
        { counts: [0, 3] },
      ).units,
    ).toBe(3);
    expect(() => multiRaterAgreement([["A", "B"]], { counts: [1.5] })).toThrow(/whole number/);
    expect(() => multiRaterAgreement([["A", "B"]], { counts: [1, 2] })).toThrow(/one entry per unit/);
  });
});

describe("gradeSetsOf (the scorecards' counted rechecks as grade sets)", () => {
  // REF's units with two or three grades, as rechecks (first, recheck, adjudicated), each spread over
  // two graders and two weeks as the SQL counts them, plus rows alpha and AC1 must not see.
  const rechecked = THREE_CODERS.filter((unit) => unit.length >= 2);
  const rows = rechecked.flatMap(([firstGrade, recheckGrade, adjudicatedGrade], index) => [
    { graderId: `g${index % 2}`, week: "2026-11-02", firstGrade, recheckGrade, adjudicatedGrade: adjudicatedGrade ?? null, blind: true, count: 1 },
    { graderId: `g${(index + 1) % 2}`, week: "2026-11-09", firstGrade, recheckGrade, adjudicatedGrade: adjudicatedGrade ?? null, blind: true, count: index % 3 },
    // Not blind: the auditor could have seen the first grade, so it is in no figure.
    { graderId: "g0", week: "2026-11-09", firstGrade, recheckGrade: "Reject" as Grade, adjudicatedGrade: null, blind: false, count: 5 },
  ]);

  it("sums rows alike over graders and weeks, leaves out the not-blind ones, and gives the units' figures (REF)", () => {
    const { units, counts } = gradeSetsOf(rows);
    const figures = multiRaterAgreement(units, { counts });
    const written = multiRaterAgreement(rechecked.flatMap((unit, index) => Array.from({ length: 1 + (index % 3) }, () => unit)));
    expect(figures.units).toBe(written.units);
    expect(figures.grades).toBe(written.grades);
    expect(figures.alphaOrdinal).toBeCloseTo(written.alphaOrdinal, 12);
    expect(figures.ac1).toBeCloseTo(written.ac1, 12);
    // Each set once: REF's ordinal alpha 0.806721.
    const once = gradeSetsOf(rows.filter((row) => row.week === "2026-11-02"));
    expect(Number(multiRaterAgreement(once.units, { counts: once.counts }).alphaOrdinal.toFixed(6))).toBe(0.806721);
    // Identical sets from different graders and weeks become one entry.
    expect(new Set(units.map((unit) => unit.join("|"))).size).toBe(units.length);
    expect(units.length).toBeLessThan(rechecked.length);
  });
});

describe("calibrationGradeSets (calibration items as units: the key and each taker's grade)", () => {
  it("makes Gwet's 5 observers' data, read as one key and four takers per item, give the same AC1 0.497 (IRR a)", () => {
    // Each unit's first grade stands for the key, the others for the takers who graded that item.
    const items = FIVE_OBSERVERS.map(([keyGrade, ...given]) => ({ keyGrade, given }));
    const units = calibrationGradeSets(items);
    expect(units).toEqual(FIVE_OBSERVERS);
    expect(Number(multiRaterAgreement(units).ac1.toFixed(3))).toBe(0.497);
  });

  it("an item nobody took in the period is the key alone and counts in neither figure (HAND)", () => {
    const units = calibrationGradeSets([
      { keyGrade: "B", given: [] },
      { keyGrade: "A", given: ["A", "B"] },
    ]);
    expect(units).toEqual([["B"], ["A", "A", "B"]]);
    expect(multiRaterAgreement(units)).toMatchObject({ units: 1, grades: 3, unitsWithMoreThanTwo: 1 });
  });
});
