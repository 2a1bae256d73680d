import { describe, expect, it } from "vitest";
import {
  INSPECTION_LEVELS,
  PREFERRED_AQLS,
  REDUCED_SAMPLE_SIZE_BY_LETTER,
  SAMPLE_SIZE_BY_LETTER,
  SamplingInputError,
  TIGHTENED_EXTRA_LETTER,
  CODE_LETTERS,
  aqlStepTighter,
  codeLetterFor,
  judgeLot,
  resolvePlan,
  singleSamplingPlan,
  tighterAcceptNumber,
  type CodeLetter,
  type InspectionSeverity,
} from "@/lib/sampling/iso2859";

// Sources (marks as in docs/references.md: (a) read in a public source, (b) from memory):
// REF  docs/references.md, "Acceptance sampling — ISO 2859-1" (Table 1 and sample sizes, a).
// N1   nibs.org FMOC/DPW_AC/AC-TABLE.ASC, Table 1-A "developed from MIL-STD-105E Table II-A":
//      Re numbers and arrows for AQL 0.65–15, letters A–Q (a).
// N2   qualitycontrolpartners.com/aql-tables, "Source: ISO 2859-1": plan cells AQL 0.065–6.5 (a).
// N3   a public code copy of Z1.4 Table II-A with its arrow cells (AQL 0.065–15) (a).
// N4   MIL-STD-105E Table II-A as text (scribd "Tablas" copy): the plans of each row in order (a).
// T1   nibs.org AC-TABLE.ASC Table 1-B "Single Tightened", from MIL-STD-105E Table II-B: Re numbers
//      and arrows for AQL 0.65–15, letters A–L (a).
// T2   a public code copy of the tightened table (own-row plans, AQL 0.010–6.5); its plan cells agree
//      with T1, its arrow resolution next to the 0/1 plans does not (it goes up; T1 draws ↓↓) (a).
// Z1   a public how-to page on Z1.4 Table II-C: "Code J, AQL 1.5 under Reduced → n≈32, Ac=1, Re=4" (a).

// REF Table 1 (a, four sources agree): letters for S-1, S-2, S-3, S-4, I, II, III.
const TABLE_1: Array<[min: number, max: number, letters: string]> = [
  [2, 8, "A A A A A A B"],
  [9, 15, "A A A A A B C"],
  [16, 25, "A A B B B C D"],
  [26, 50, "A B B C C D E"],
  [51, 90, "B B C C C E F"],
  [91, 150, "B B C D D F G"],
  [151, 280, "B C D E E G H"],
  [281, 500, "B C D E F H J"],
  [501, 1200, "C C E F G J K"],
  [1201, 3200, "C D E G H K L"],
  [3201, 10000, "C D F G J L M"],
  [10001, 35000, "C D F H K M N"],
  [35001, 150000, "D E G J L N P"],
  [150001, 500000, "D E G J M P Q"],
  [500001, 5_000_000, "D E H K N Q R"],
];

describe("Table 1 — sample size code letters (REF, a)", () => {
  for (const [min, max, letters] of TABLE_1) {
    it(`lot sizes ${min}–${max} give ${letters} for every level, at both ends of the row`, () => {
      const expected = letters.split(" ");
      for (const lotSize of [min, max]) {
        expect(INSPECTION_LEVELS.map((level) => codeLetterFor(lotSize, level))).toEqual(expected);
      }
    });
  }
});

it("sample sizes A…R are 2 … 2000 (REF, a) and reduced sizes 2 … 800 (b, from memory)", () => {
  expect(CODE_LETTERS.map((letter) => SAMPLE_SIZE_BY_LETTER[letter])).toEqual([2, 3, 5, 8, 13, 20, 32, 50, 80, 125, 200, 315, 500, 800, 1250, 2000]);
  expect(CODE_LETTERS.map((letter) => REDUCED_SAMPLE_SIZE_BY_LETTER[letter])).toEqual([2, 2, 2, 3, 5, 8, 13, 20, 32, 50, 80, 125, 200, 315, 500, 800]);
});

type Expected = [letter: CodeLetter, aql: number, planLetter: CodeLetter, sampleSize: number, accept: number, reject: number, source: string];

function checkCells(severity: InspectionSeverity, cells: Expected[]) {
  for (const [letter, aql, planLetter, sampleSize, accept, reject, source] of cells) {
    it(`${letter} at AQL ${aql} → ${planLetter} n=${sampleSize} Ac ${accept} Re ${reject} — ${source}`, () => {
      expect(resolvePlan(letter, aql, severity)).toEqual({ planLetter, sampleSize, accept, reject });
    });
  }
}

describe("Table 2-A — normal inspection, resolved plans", () => {
  checkCells("normal", [
    ["A", 6.5, "A", 2, 0, 1, "N1 Re 1, N2"],
    ["F", 0.65, "F", 20, 0, 1, "N1, N2"],
    ["F", 1.0, "E", 13, 0, 1, "↑; N1, N3"],
    ["F", 1.5, "G", 32, 1, 2, "↓; N1, N3"],
    ["F", 2.5, "F", 20, 1, 2, "N1, N2"],
    ["F", 4.0, "F", 20, 2, 3, "N1, N2"],
    ["F", 6.5, "F", 20, 3, 4, "N1, N2"],
    ["F", 10, "F", 20, 5, 6, "N1, N3"],
    ["H", 4.0, "H", 50, 5, 6, "N1, N2"],
    ["H", 0.65, "J", 80, 1, 2, "↓; N1, N3"],
    ["G", 0.65, "F", 20, 0, 1, "↑; N1, N3"],
    ["E", 0.65, "F", 20, 0, 1, "↓; N1, N3"],
    ["A", 0.65, "F", 20, 0, 1, "↓ over five rows; N1, N3"],
    ["J", 2.5, "J", 80, 5, 6, "N1, N2"],
    ["J", 10, "J", 80, 14, 15, "N1, N3"],
    ["K", 0.4, "K", 125, 1, 2, "N2, N3"],
    ["K", 10, "K", 125, 21, 22, "N1, N3"],
    ["L", 0.065, "L", 200, 0, 1, "N2, N3"],
    ["L", 10, "K", 125, 21, 22, "↑; N1, N3"],
    ["B", 6.5, "A", 2, 0, 1, "↑; N1, N3"],
    ["B", 10, "C", 5, 1, 2, "↓; N1, N3"],
    ["C", 6.5, "D", 8, 1, 2, "↓; N1, N3"],
    ["D", 2.5, "C", 5, 0, 1, "↑; N1, N3"],
    ["D", 4.0, "E", 13, 1, 2, "↓; N1, N3"],
    ["M", 0.065, "L", 200, 0, 1, "↑; N3"],
    ["N", 0.065, "P", 800, 1, 2, "↓; N3"],
    ["Q", 1.0, "Q", 1250, 21, 22, "N1, N3"],
    ["Q", 1.5, "P", 800, 21, 22, "↑; N1, N3"],
    ["R", 0.065, "R", 2000, 3, 4, "N3; N4 (row R starts 1 2 at 0.025)"],
    // Corners of the offered range.
    ["A", 0.065, "L", 200, 0, 1, "corner ↓ down to the first plan; N2, N3"],
    ["R", 10, "K", 125, 21, 22, "corner ↑ up to the last plan of the column; N1, N3"],
    // Sources conflict here: N1 draws ↑ (nothing above row A), N3 has ↓. We follow ↓ (unverified).
    ["A", 10, "C", 5, 1, 2, "↓; N3 only (N1 disagrees)"],
  ]);
});

describe("Table 2-B — tightened inspection, resolved plans", () => {
  checkCells("tightened", [
    ["B", 6.5, "B", 3, 0, 1, "T1 Re 1, T2"],
    ["C", 6.5, "E", 13, 1, 2, "↓↓; T1 (T2 resolves up instead)"],
    ["D", 6.5, "E", 13, 1, 2, "↓; T1"],
    ["A", 10, "D", 8, 1, 2, "↓ over three rows; T1"],
    ["E", 1.5, "E", 13, 0, 1, "T1, T2"],
    ["E", 4.0, "F", 20, 1, 2, "↓; T1"],
    ["F", 1.0, "F", 20, 0, 1, "T1, T2"],
    ["F", 1.5, "H", 50, 1, 2, "↓↓; T1"],
    ["F", 2.5, "G", 32, 1, 2, "↓; T1"],
    ["F", 4.0, "F", 20, 1, 2, "T1, T2"],
    ["F", 10, "F", 20, 3, 4, "T1"],
    ["G", 0.65, "G", 32, 0, 1, "T1, T2"],
    ["H", 10, "H", 50, 8, 9, "T1"],
    ["J", 2.5, "J", 80, 3, 4, "T1, T2"],
    ["J", 6.5, "J", 80, 8, 9, "T1, T2"],
    ["J", 10, "J", 80, 12, 13, "T1"],
    ["K", 10, "K", 125, 18, 19, "T1"],
    ["L", 10, "K", 125, 18, 19, "↑; T1"],
    ["R", 10, "K", 125, 18, 19, "corner ↑; T1 for the column's last plan, rows M–R (b)"],
    ["A", 0.065, "M", 315, 0, 1, "corner ↓; T2 plan cell, direction (b)"],
    ["N", 0.065, "Q", 1250, 1, 2, "↓↓; T2 plan cell, direction as drawn in T1 (b)"],
  ]);

  it("letter S (3150) exists only in the 0.010 column: no offered AQL leads to it (b)", () => {
    expect(TIGHTENED_EXTRA_LETTER).toEqual({ letter: "S", sampleSize: 3150 });
    const reached = new Set(CODE_LETTERS.flatMap((letter) => PREFERRED_AQLS.map((aql) => resolvePlan(letter, aql, "tightened").planLetter)));
    expect(reached.has("S" as CodeLetter)).toBe(false);
  });

  it("tightened is never looser than normal: same sample and Ac no larger, or a larger sample (structure check)", () => {
    for (const letter of CODE_LETTERS) {
      for (const aql of PREFERRED_AQLS) {
        const normal = resolvePlan(letter, aql, "normal");
        const tightened = resolvePlan(letter, aql, "tightened");
        if (tightened.sampleSize === normal.sampleSize) expect(tightened.accept).toBeLessThanOrEqual(normal.accept);
        else expect(tightened.sampleSize).toBeGreaterThan(normal.sampleSize);
      }
    }
  });
});

describe("Table 2-C — reduced inspection (Z1.4 plans with the Ac/Re gap; b, from memory)", () => {
  checkCells("reduced", [
    ["J", 1.5, "J", 32, 1, 4, "Z1 (a) and b"],
    ["A", 6.5, "A", 2, 0, 1, "b"],
    ["B", 6.5, "A", 2, 0, 1, "↑; b"],
    ["C", 10, "C", 2, 0, 2, "b"],
    ["A", 10, "C", 2, 0, 2, "↓; b"],
    ["F", 2.5, "F", 8, 0, 2, "b"],
    ["H", 4.0, "H", 20, 2, 5, "b"],
    ["K", 10, "K", 50, 10, 13, "b"],
    ["L", 10, "K", 50, 10, 13, "↑; b"],
    ["M", 0.065, "L", 80, 0, 1, "↑; b"],
    ["N", 0.065, "P", 315, 0, 2, "↓; b"],
    ["A", 0.065, "L", 80, 0, 1, "corner ↓; b"],
    ["R", 10, "K", 50, 10, 13, "corner ↑; b"],
  ]);
});

describe("singleSamplingPlan", () => {
  it("returns Table 1's letter and the plan after arrows (lot 1000, II, AQL 2.5: J, n 80, 5/6; N1, N2)", () => {
    expect(singleSamplingPlan({ lotSize: 1000, level: "II", aql: 2.5, severity: "normal" })).toEqual({
      codeLetter: "J",
      planLetter: "J",
      sampleSize: 80,
      accept: 5,
      reject: 6,
      hundredPercent: false,
    });
  });

  it("keeps the code letter when an arrow moves the plan (lot 120, II → F; AQL 1.0 ↑ to E, n 13; N1)", () => {
    expect(singleSamplingPlan({ lotSize: 120, level: "II", aql: 1.0, severity: "normal" })).toMatchObject({
      codeLetter: "F",
      planLetter: "E",
      sampleSize: 13,
      accept: 0,
      reject: 1,
    });
  });

  it("uses the tightened table when asked (lot 1000, II, 2.5 tightened: J, n 80, 3/4; T1)", () => {
    expect(singleSamplingPlan({ lotSize: 1000, level: "II", aql: 2.5, severity: "tightened" })).toMatchObject({
      codeLetter: "J",
      sampleSize: 80,
      accept: 3,
      reject: 4,
    });
  });

  // REF (a): "If sample size equals or exceeds lot size, do 100 percent inspection."
  it("switches to 100 % inspection when the sample exceeds the lot (lot 5, II, 0.65 → F n 20)", () => {
    expect(singleSamplingPlan({ lotSize: 5, level: "II", aql: 0.65, severity: "normal" })).toEqual({
      codeLetter: "A",
      planLetter: "F",
      sampleSize: 5,
      accept: 0,
      reject: 1,
      hundredPercent: true,
    });
  });

  it("switches to 100 % inspection when the sample equals the lot (lot 13, II, 1.0 → E n 13)", () => {
    expect(singleSamplingPlan({ lotSize: 13, level: "II", aql: 1.0, severity: "normal" })).toMatchObject({
      codeLetter: "B",
      planLetter: "E",
      sampleSize: 13,
      hundredPercent: true,
    });
  });

  it("treats a lot of one unit as 100 % inspection of that unit", () => {
    expect(singleSamplingPlan({ lotSize: 1, level: "II", aql: 6.5, severity: "normal" })).toMatchObject({
      codeLetter: "A",
      sampleSize: 1,
      accept: 0,
      reject: 1,
      hundredPercent: true,
    });
  });

  const bad: Array<[string, unknown, RegExp]> = [
    ["lot size 0", { lotSize: 0, level: "II", aql: 1, severity: "normal" }, /lotSize/],
    ["negative lot size", { lotSize: -5, level: "II", aql: 1, severity: "normal" }, /lotSize/],
    ["fractional lot size", { lotSize: 2.5, level: "II", aql: 1, severity: "normal" }, /lotSize/],
    ["NaN lot size", { lotSize: Number.NaN, level: "II", aql: 1, severity: "normal" }, /lotSize/],
    ["infinite lot size", { lotSize: Infinity, level: "II", aql: 1, severity: "normal" }, /lotSize/],
    ["lot size as text", { lotSize: "100", level: "II", aql: 1, severity: "normal" }, /lotSize/],
    ["unknown level", { lotSize: 100, level: "IV", aql: 1, severity: "normal" }, /level/],
    ["lower-case level", { lotSize: 100, level: "s-1", aql: 1, severity: "normal" }, /level/],
    ["AQL not preferred", { lotSize: 100, level: "II", aql: 0.3, severity: "normal" }, /aql/],
    ["AQL below the offered range", { lotSize: 100, level: "II", aql: 0.04, severity: "normal" }, /aql/],
    ["AQL above the offered range", { lotSize: 100, level: "II", aql: 15, severity: "normal" }, /aql/],
    ["AQL as text", { lotSize: 100, level: "II", aql: "2.5", severity: "normal" }, /aql/],
    ["unknown severity", { lotSize: 100, level: "II", aql: 1, severity: "strict" }, /severity/],
    ["defect severity instead of inspection severity", { lotSize: 100, level: "II", aql: 1, severity: "major" }, /severity/],
    ["missing input", undefined, /./],
  ];
  for (const [name, input, message] of bad) {
    it(`throws SamplingInputError for ${name}`, () => {
      const call = () => singleSamplingPlan(input as Parameters<typeof singleSamplingPlan>[0]);
      expect(call).toThrow(SamplingInputError);
      expect(call).toThrow(message);
    });
  }
});

describe("AQL steps and lot verdicts", () => {
  it("aqlStepTighter walks the standard's series (b) and rejects other values", () => {
    expect(aqlStepTighter(10)).toBe(6.5);
    expect(aqlStepTighter(1.0)).toBe(0.65);
    expect(aqlStepTighter(0.065)).toBe(0.04);
    expect(aqlStepTighter(0.01)).toBeNull();
    expect(() => aqlStepTighter(0.3)).toThrow(SamplingInputError);
  });

  it("tighterAcceptNumber reads 2-A at the same plan letter one step tighter", () => {
    expect(tighterAcceptNumber("L", 2.5)).toBe(7); // L at 1.5 is 7/8 (N2)
    expect(tighterAcceptNumber("J", 2.5)).toBe(3); // J at 1.5 is 3/4 (N1, N2)
    expect(tighterAcceptNumber("Q", 0.065)).toBe(1); // Q at 0.040 is 1/2 (T2's normal copy, N4)
    expect(tighterAcceptNumber("F", 0.65)).toBeNull(); // F at 0.40 is an arrow
  });

  it("judgeLot: <= Ac accept, >= Re not accepted, in the reduced gap accept but back to normal (Z1.4 §10.1.4, a)", () => {
    expect(judgeLot({ accept: 5, reject: 6 }, 5)).toBe("accept");
    expect(judgeLot({ accept: 5, reject: 6 }, 6)).toBe("not-accepted");
    expect(judgeLot({ accept: 1, reject: 4 }, 2)).toBe("accept-reinstate-normal");
    expect(judgeLot({ accept: 1, reject: 4 }, 4)).toBe("not-accepted");
    expect(() => judgeLot({ accept: 1, reject: 2 }, -1)).toThrow(SamplingInputError);
  });
});
