/**
 * The recheck draw. Marks as in docs/references.md: (a) public source, (b) from memory, (c) ours.
 * RULE  the rules of lib/recheck/draw.ts (target ⌈rate × n⌉ with a minimum, spread over part
 *       types, never twice) — our decisions (c), counted by hand beside each check (HAND).
 * CHI   Pearson's chi-squared goodness-of-fit test for uniform draws (c, common practice); the
 *       0.999 quantile of χ² with 19 degrees of freedom, 43.8202, from SciPy 1.17.1
 *       `scipy.stats.chi2.ppf(0.999, 19)` (reference library, the machine's Python 3.11, run here).
 */
import { describe, expect, it } from "vitest";
import { drawRechecks, recheckRateFor, RECHECK_DRAW_ALGORITHM, type DrawCandidate } from "@/lib/recheck/draw";
import { DEFAULT_RECHECK_SETTINGS, recheckSettingsSchema } from "@/lib/recheck/settings";

/** `count` grades of one grader and part type, ids `${grader}-${partType}-${i}`. */
const grades = (graderId: string, partTypeId: string, count: number): DrawCandidate[] =>
  Array.from({ length: count }, (_, i) => ({ gradeId: `${graderId}-${partTypeId}-${String(i).padStart(3, "0")}`, graderId, partTypeId }));

const countBy = <T>(items: T[], key: (item: T) => string) => items.reduce<Record<string, number>>((counts, item) => ({ ...counts, [key(item)]: (counts[key(item)] ?? 0) + 1 }), {});

describe("drawRechecks: how many (RULE, HAND)", () => {
  it("draws ⌈5 % × n⌉ per grader, at least the minimum, and 7 % of 100 is 7, not 8", () => {
    const candidates = [...grades("ann", "cam", 100), ...grades("bo", "cam", 3), ...grades("cy", "cam", 41)];
    const result = drawRechecks({ seed: "42", candidates, rate: 0.05, minimumPerGrader: 1 });
    expect(result.graders).toEqual([
      { graderId: "ann", grades: 100, rate: 0.05, target: 5, drawnBefore: 0, drawn: 5 },
      { graderId: "bo", grades: 3, rate: 0.05, target: 1, drawnBefore: 0, drawn: 1 },
      // 5 % of 41 = 2.05 → 3 (the rate is a floor).
      { graderId: "cy", grades: 41, rate: 0.05, target: 3, drawnBefore: 0, drawn: 3 },
    ]);
    expect(result.drawn).toHaveLength(9);
    // 0.07 × 100 is 7.000000000000001 in floating point.
    expect(drawRechecks({ seed: "42", candidates: grades("ann", "cam", 100), rate: 0.07 }).graders[0].target).toBe(7);
  });

  it("applies a minimum above ⌈rate × n⌉ only on the period's final run, and never more than n", () => {
    const candidates = [...grades("ann", "cam", 30), ...grades("bo", "cam", 2)];
    const final = drawRechecks({ seed: "7", candidates, rate: 0.05, minimumPerGrader: 3 });
    expect(final.graders.map((g) => [g.graderId, g.target])).toEqual([
      ["ann", 3],
      ["bo", 2],
    ]);
    const running = drawRechecks({ seed: "7", candidates, rate: 0.05, minimumPerGrader: 3, final: false });
    expect(running.graders.map((g) => [g.graderId, g.target])).toEqual([
      ["ann", 2],
      ["bo", 1],
    ]);
  });

  it("uses a grader's own (raised) rate", () => {
    const settings = { rate: 0.05, raisedRate: 0.2 };
    expect(recheckRateFor(settings, {})).toBe(0.05);
    expect(recheckRateFor(settings, { lastCalibrationFailed: true })).toBe(0.2);
    expect(recheckRateFor(settings, { drifting: true })).toBe(0.2);
    const result = drawRechecks({ seed: "1", candidates: [...grades("ann", "cam", 100), ...grades("bo", "cam", 100)], rate: 0.05, graderRates: { bo: recheckRateFor(settings, { drifting: true }) } });
    expect(result.graders.map((g) => [g.graderId, g.rate, g.drawn])).toEqual([
      ["ann", 0.05, 5],
      ["bo", 0.2, 20],
    ]);
  });
});

describe("drawRechecks: never twice (RULE)", () => {
  it("counts grades drawn before towards the target and never draws them again", () => {
    const candidates = grades("ann", "cam", 100);
    const before = ["ann-cam-003", "ann-cam-050"];
    const result = drawRechecks({ seed: "99", candidates, rate: 0.05, alreadyDrawn: before });
    expect(result.graders[0]).toMatchObject({ target: 5, drawnBefore: 2, drawn: 3 });
    expect(result.drawn.map((g) => g.gradeId)).not.toContain("ann-cam-003");
    expect(result.drawn.map((g) => g.gradeId)).not.toContain("ann-cam-050");
  });

  it("running the same draw again with its result recorded adds nothing", () => {
    const candidates = [...grades("ann", "cam", 60), ...grades("ann", "bat", 40)];
    const first = drawRechecks({ seed: "5", candidates, rate: 0.1 });
    const again = drawRechecks({ seed: "6", candidates, rate: 0.1, alreadyDrawn: first.drawn.map((g) => g.gradeId) });
    expect(again.drawn).toEqual([]);
    expect(again.graders[0]).toMatchObject({ target: 10, drawnBefore: 10, drawn: 0 });
  });

  it("a draw during the week, then the final run, together reach the target once (HAND)", () => {
    const monday = grades("ann", "cam", 40);
    const week = [...monday, ...grades("ann", "bat", 60)];
    const early = drawRechecks({ seed: "11", candidates: monday, rate: 0.05, final: false });
    expect(early.drawn).toHaveLength(2);
    const late = drawRechecks({ seed: "12", candidates: week, rate: 0.05, alreadyDrawn: early.drawn.map((g) => g.gradeId) });
    expect(late.graders[0]).toMatchObject({ target: 5, drawnBefore: 2, drawn: 3 });
    const all = [...early.drawn, ...late.drawn].map((g) => g.gradeId);
    expect(new Set(all).size).toBe(5);
  });

  it("refuses a grade listed twice", () => {
    expect(() => drawRechecks({ seed: "1", candidates: [...grades("ann", "cam", 2), grades("ann", "cam", 1)[0]], rate: 0.5 })).toThrow(/listed twice/);
  });
});

describe("drawRechecks: spread over part types (RULE, HAND)", () => {
  it("gives every part type one before any gets two, then fills in proportion: 60 + 40 grades, 5 drawn → 3 and 2", () => {
    const candidates = [...grades("ann", "cam", 60), ...grades("ann", "bat", 40)];
    for (const seed of ["1", "2", "3", "4"]) {
      const result = drawRechecks({ seed, candidates, rate: 0.05 });
      // One each; then shares cam 1/60 ≈ 0.017 < bat 1/40 = 0.025 → cam; bat 0.025 < cam 2/60 ≈ 0.033 → bat;
      // cam 0.033 < bat 2/40 = 0.05 → cam. So cam 3, bat 2, whatever the seed.
      expect(countBy(result.drawn, (g) => g.partTypeId)).toEqual({ cam: 3, bat: 2 });
    }
  });

  it("with fewer draws than part types, takes at most one per type and varies which with the seed", () => {
    const candidates = ["a", "b", "c", "d", "e"].flatMap((partType) => grades("ann", partType, 20));
    const picked = new Set<string>();
    for (let seed = 0; seed < 40; seed++) {
      const result = drawRechecks({ seed: String(seed), candidates, rate: 0.02 });
      const perType = countBy(result.drawn, (g) => g.partTypeId);
      expect(result.drawn).toHaveLength(2);
      expect(Math.max(...Object.values(perType))).toBe(1);
      for (const type of Object.keys(perType)) picked.add(type);
    }
    expect(picked.size).toBe(5);
  });

  it("draws each grade of a stratum equally often over many seeds (CHI)", () => {
    const candidates = grades("ann", "cam", 20);
    const hits = new Map<string, number>();
    const runs = 4000;
    for (let seed = 0; seed < runs; seed++) {
      for (const grade of drawRechecks({ seed: String(seed), candidates, rate: 0.25 }).drawn) hits.set(grade.gradeId, (hits.get(grade.gradeId) ?? 0) + 1);
    }
    const expected = (runs * 5) / 20;
    const chiSquared = candidates.reduce((sum, grade) => sum + ((hits.get(grade.gradeId) ?? 0) - expected) ** 2 / expected, 0);
    expect(chiSquared).toBeLessThan(43.82);
  });
});

describe("drawRechecks: reproducible and recorded (RULE)", () => {
  const candidates = [...grades("ann", "cam", 50), ...grades("ann", "bat", 30), ...grades("bo", "cam", 70)];

  it("gives the same draw for the same seed whatever the order of the rows, and names its algorithm and seed", () => {
    const first = drawRechecks({ seed: "123456789", candidates, rate: 0.1 });
    const shuffled = [...candidates].reverse();
    const second = drawRechecks({ seed: "123456789", candidates: shuffled, rate: 0.1 });
    expect(second).toEqual(first);
    expect(first).toMatchObject({ algorithm: RECHECK_DRAW_ALGORITHM, seed: "123456789" });
  });

  it("gives a different draw for another seed", () => {
    const a = drawRechecks({ seed: "1", candidates, rate: 0.1 }).drawn.map((g) => g.gradeId);
    const b = drawRechecks({ seed: "2", candidates, rate: 0.1 }).drawn.map((g) => g.gradeId);
    expect(a).not.toEqual(b);
  });

  it("refuses a bad seed or rate with a readable message", () => {
    expect(() => drawRechecks({ seed: "-1", candidates, rate: 0.1 })).toThrow(/seed is a whole number/);
    expect(() => drawRechecks({ seed: "1", candidates, rate: 0 })).toThrow(/above 0 and at most 1/);
    expect(() => drawRechecks({ seed: "1", candidates, rate: 0.1, graderRates: { bo: 1.5 } })).toThrow(/grader bo/);
    expect(() => drawRechecks({ seed: "1", candidates, rate: 0.1, minimumPerGrader: -1 })).toThrow(/minimum per grader/);
  });
});

describe("drawRechecks: who can take a drawn grade (RULE)", () => {
  it("notes how many auditors other than the grader there are and lists grades nobody else could take", () => {
    const result = drawRechecks({ seed: "3", candidates: [...grades("ann", "cam", 10), ...grades("aud", "cam", 10)], rate: 0.1, auditorIds: ["aud"] });
    const byGrader = Object.fromEntries(result.drawn.map((g) => [g.graderId, g]));
    expect(byGrader.ann.otherAuditors).toBe(1);
    // "aud" is the only auditor and graded this one: no one else may recheck it.
    expect(byGrader.aud.otherAuditors).toBe(0);
    expect(result.noOtherAuditor).toEqual([byGrader.aud.gradeId]);
  });
});

describe("recheckSettingsSchema", () => {
  it("accepts the defaults and refuses a raised rate below the normal one, with a message a person understands", () => {
    expect(recheckSettingsSchema.parse(DEFAULT_RECHECK_SETTINGS)).toEqual(DEFAULT_RECHECK_SETTINGS);
    const low = recheckSettingsSchema.safeParse({ ...DEFAULT_RECHECK_SETTINGS, raisedRate: 0.01 });
    expect(low.error?.issues[0]).toMatchObject({ path: ["raisedRate"], message: "The raised rate must be at least the normal rate." });
    expect(recheckSettingsSchema.safeParse({ ...DEFAULT_RECHECK_SETTINGS, rate: 0 }).error?.issues[0].message).toMatch(/above 0/);
    expect(recheckSettingsSchema.safeParse({ ...DEFAULT_RECHECK_SETTINGS, driftWeeks: 0 }).error?.issues[0].message).toMatch(/at least one week/);
  });
});
