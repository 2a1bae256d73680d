/**
 * ISO 2859-1 single sampling plans (attributes, lot by lot). Pure data + lookups, no I/O.
 *
 * What is implemented (read this before trusting a number):
 * - Table 1 (code letters) and Tables 2-A (normal) / 2-B (tightened) as in ISO 2859-1, which
 *   carries the same tables as MIL-STD-105E and ANSI/ASQ Z1.4. Cells were checked against
 *   public renderings of those tables (see tests/unit/sampling for each source and its mark).
 * - Table 2-C (reduced): the REDUCED PLANS OF ANSI/ASQ Z1.4 / MIL-STD-105E / ISO 2859-1:1989,
 *   which keep a gap between Ac and Re (e.g. Ac 1, Re 4). They are NOT the ISO 2859-1:1999
 *   reduced plans (that edition removed the gap); we could not verify those and do not claim
 *   them. With a gap, a lot with Ac < defects < Re is accepted but normal inspection is
 *   reinstated (Z1.4 §8.3.4 b, §10.1.4) — see judgeLot(). The 2-C cells are from memory (b),
 *   laid out on the same diagonal structure as 2-A; two cells were seen in public material.
 * - Only the preferred AQLs 0.065 … 10 (percent nonconforming range) are offered. Table 2-A also
 *   holds the 0.040 column, used only to answer "one AQL step tighter" for the switching score.
 * - Arrow cells are data ("down" / "up"), resolved by walking the column to the first plan
 *   below / above; the plan reached supplies letter, sample size, Ac and Re (table footnote).
 * The licensed standard governs; these tables are a summary for decision support.
 */
import { z } from "zod";

export class SamplingInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "SamplingInputError";
  }
}

export const INSPECTION_LEVELS = ["S-1", "S-2", "S-3", "S-4", "I", "II", "III"] as const;
export type InspectionLevel = (typeof INSPECTION_LEVELS)[number];

export const INSPECTION_SEVERITIES = ["normal", "tightened", "reduced"] as const;
/** Severity of inspection (normal / tightened / reduced) — not the severity of a defect. */
export type InspectionSeverity = (typeof INSPECTION_SEVERITIES)[number];

/** The preferred AQL values this app offers (percent nonconforming, 0.065 … 10). */
export const PREFERRED_AQLS = [0.065, 0.1, 0.15, 0.25, 0.4, 0.65, 1.0, 1.5, 2.5, 4.0, 6.5, 10] as const;
/** The standard's AQL series from 0.010 up to 10, used for "one step tighter". */
export const AQL_SERIES = [0.01, 0.015, 0.025, 0.04, ...PREFERRED_AQLS] as const;

export const CODE_LETTERS = ["A", "B", "C", "D", "E", "F", "G", "H", "J", "K", "L", "M", "N", "P", "Q", "R"] as const;
export type CodeLetter = (typeof CODE_LETTERS)[number];
/** Table 2-B also has letter S (n = 3150), used only in its 0.010 column (outside our AQLs). */
export type PlanLetter = CodeLetter | "S";

/** Sample size per letter for normal and tightened inspection (Tables 2-A, 2-B). */
export const SAMPLE_SIZE_BY_LETTER: Readonly<Record<CodeLetter, number>> = {
  A: 2,
  B: 3,
  C: 5,
  D: 8,
  E: 13,
  F: 20,
  G: 32,
  H: 50,
  J: 80,
  K: 125,
  L: 200,
  M: 315,
  N: 500,
  P: 800,
  Q: 1250,
  R: 2000,
};
/** Table 2-B's extra letter. No cell in the 0.065 … 10 columns leads to it. */
export const TIGHTENED_EXTRA_LETTER = { letter: "S", sampleSize: 3150 } as const;
/** Reduced sample sizes per letter (Z1.4 Table II-C; from memory (b)). */
export const REDUCED_SAMPLE_SIZE_BY_LETTER: Readonly<Record<CodeLetter, number>> = {
  A: 2,
  B: 2,
  C: 2,
  D: 3,
  E: 5,
  F: 8,
  G: 13,
  H: 20,
  J: 32,
  K: 50,
  L: 80,
  M: 125,
  N: 200,
  P: 315,
  Q: 500,
  R: 800,
};

// No MAX_LOT_SIZE: Table 1's last row is "500 001 and over".
/** Table 1: upper lot size of each row and its letters for S-1, S-2, S-3, S-4, I, II, III. */
const CODE_LETTER_ROWS: ReadonlyArray<readonly [maxLot: number, letters: string]> = [
  [8, "AAAAAAB"],
  [15, "AAAAABC"],
  [25, "AABBBCD"],
  [50, "ABBCCDE"],
  [90, "BBCCCEF"],
  [150, "BBCDDFG"],
  [280, "BCDEEGH"],
  [500, "BCDEFHJ"],
  [1200, "CCEFGJK"],
  [3200, "CDEGHKL"],
  [10000, "CDFGJLM"],
  [35000, "CDFHKMN"],
  [150000, "DEGJLNP"],
  [500000, "DEGJMPQ"],
  [Infinity, "DEHKNQR"],
];

type Plan = readonly [accept: number, reject: number];
type Cell = Plan | "down" | "up";
interface MasterTable {
  readonly name: string;
  readonly columns: readonly number[];
  readonly sampleSizes: Readonly<Record<CodeLetter, number>>;
  readonly rows: Readonly<Record<CodeLetter, readonly Cell[]>>;
}
// Arrow cells: "use the first sampling plan below (DN) / above (UP) the arrow".
const DN = "down";
const UP = "up";

/** Table 2-A, single sampling, normal inspection (ISO 2859-1 = MIL-STD-105E II-A = Z1.4 II-A). */
const NORMAL: MasterTable = {
  name: "Table 2-A (normal)",
  columns: [0.04, ...PREFERRED_AQLS],
  sampleSizes: SAMPLE_SIZE_BY_LETTER,
  rows: {
    //  0.040    0.065   0.10    0.15    0.25    0.40    0.65    1.0     1.5     2.5     4.0     6.5     10
    // (A at 10: a public rendering draws ↑, which leads nowhere; another copy has ↓ — we use ↓.)
    A: [DN, DN, DN, DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], DN],
    B: [DN, DN, DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], UP, DN],
    C: [DN, DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], UP, DN, [1, 2]],
    D: [DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], UP, DN, [1, 2], [2, 3]],
    E: [DN, DN, DN, DN, DN, DN, DN, [0, 1], UP, DN, [1, 2], [2, 3], [3, 4]],
    F: [DN, DN, DN, DN, DN, DN, [0, 1], UP, DN, [1, 2], [2, 3], [3, 4], [5, 6]],
    G: [DN, DN, DN, DN, DN, [0, 1], UP, DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8]],
    H: [DN, DN, DN, DN, [0, 1], UP, DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11]],
    J: [DN, DN, DN, [0, 1], UP, DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15]],
    K: [DN, DN, [0, 1], UP, DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22]],
    L: [DN, [0, 1], UP, DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22], UP],
    M: [[0, 1], UP, DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22], UP, UP],
    N: [UP, DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22], UP, UP, UP],
    P: [DN, [1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22], UP, UP, UP, UP],
    Q: [[1, 2], [2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22], UP, UP, UP, UP, UP],
    R: [[2, 3], [3, 4], [5, 6], [7, 8], [10, 11], [14, 15], [21, 22], UP, UP, UP, UP, UP, UP],
  },
};

/**
 * Table 2-B, single sampling, tightened inspection (ISO 2859-1 = MIL-STD-105E II-B = Z1.4 II-B).
 * Unlike 2-A there is no ↑ next to the 0/1 plans: two ↓ cells lead to the 1/2 plan (as drawn in
 * a public rendering of II-B; one public code copy resolves these cells upwards instead).
 * Letter S (3150) only appears in the 0.010 column, which we do not offer.
 */
const TIGHTENED: MasterTable = {
  name: "Table 2-B (tightened)",
  columns: PREFERRED_AQLS,
  sampleSizes: SAMPLE_SIZE_BY_LETTER,
  rows: {
    //  0.065    0.10    0.15    0.25    0.40    0.65    1.0     1.5     2.5     4.0     6.5     10
    A: [DN, DN, DN, DN, DN, DN, DN, DN, DN, DN, DN, DN],
    B: [DN, DN, DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], DN],
    C: [DN, DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], DN, DN],
    D: [DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], DN, DN, [1, 2]],
    E: [DN, DN, DN, DN, DN, DN, DN, [0, 1], DN, DN, [1, 2], [2, 3]],
    F: [DN, DN, DN, DN, DN, DN, [0, 1], DN, DN, [1, 2], [2, 3], [3, 4]],
    G: [DN, DN, DN, DN, DN, [0, 1], DN, DN, [1, 2], [2, 3], [3, 4], [5, 6]],
    H: [DN, DN, DN, DN, [0, 1], DN, DN, [1, 2], [2, 3], [3, 4], [5, 6], [8, 9]],
    J: [DN, DN, DN, [0, 1], DN, DN, [1, 2], [2, 3], [3, 4], [5, 6], [8, 9], [12, 13]],
    K: [DN, DN, [0, 1], DN, DN, [1, 2], [2, 3], [3, 4], [5, 6], [8, 9], [12, 13], [18, 19]],
    L: [DN, [0, 1], DN, DN, [1, 2], [2, 3], [3, 4], [5, 6], [8, 9], [12, 13], [18, 19], UP],
    M: [[0, 1], DN, DN, [1, 2], [2, 3], [3, 4], [5, 6], [8, 9], [12, 13], [18, 19], UP, UP],
    N: [DN, DN, [1, 2], [2, 3], [3, 4], [5, 6], [8, 9], [12, 13], [18, 19], UP, UP, UP],
    P: [DN, [1, 2], [2, 3], [3, 4], [5, 6], [8, 9], [12, 13], [18, 19], UP, UP, UP, UP],
    Q: [[1, 2], [2, 3], [3, 4], [5, 6], [8, 9], [12, 13], [18, 19], UP, UP, UP, UP, UP],
    R: [[2, 3], [3, 4], [5, 6], [8, 9], [12, 13], [18, 19], UP, UP, UP, UP, UP, UP],
  },
};

/**
 * Table 2-C, single sampling, REDUCED inspection — the ANSI/ASQ Z1.4 / MIL-STD-105E II-C plans
 * (with the Ac/Re gap), not ISO 2859-1:1999's. From memory (b): same arrow layout as 2-A, the
 * reduced sample sizes above, Ac/Re series 0/1, 0/2, 1/3, 1/4, 2/5, 3/6, 5/8, 7/10, 10/13.
 */
const REDUCED: MasterTable = {
  name: "Table 2-C (reduced, Z1.4 plans)",
  columns: PREFERRED_AQLS,
  sampleSizes: REDUCED_SAMPLE_SIZE_BY_LETTER,
  rows: {
    //  0.065    0.10    0.15    0.25    0.40    0.65    1.0     1.5     2.5     4.0     6.5     10
    A: [DN, DN, DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], DN],
    B: [DN, DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], UP, DN],
    C: [DN, DN, DN, DN, DN, DN, DN, DN, [0, 1], UP, DN, [0, 2]],
    D: [DN, DN, DN, DN, DN, DN, DN, [0, 1], UP, DN, [0, 2], [1, 3]],
    E: [DN, DN, DN, DN, DN, DN, [0, 1], UP, DN, [0, 2], [1, 3], [1, 4]],
    F: [DN, DN, DN, DN, DN, [0, 1], UP, DN, [0, 2], [1, 3], [1, 4], [2, 5]],
    G: [DN, DN, DN, DN, [0, 1], UP, DN, [0, 2], [1, 3], [1, 4], [2, 5], [3, 6]],
    H: [DN, DN, DN, [0, 1], UP, DN, [0, 2], [1, 3], [1, 4], [2, 5], [3, 6], [5, 8]],
    J: [DN, DN, [0, 1], UP, DN, [0, 2], [1, 3], [1, 4], [2, 5], [3, 6], [5, 8], [7, 10]],
    K: [DN, [0, 1], UP, DN, [0, 2], [1, 3], [1, 4], [2, 5], [3, 6], [5, 8], [7, 10], [10, 13]],
    L: [[0, 1], UP, DN, [0, 2], [1, 3], [1, 4], [2, 5], [3, 6], [5, 8], [7, 10], [10, 13], UP],
    M: [UP, DN, [0, 2], [1, 3], [1, 4], [2, 5], [3, 6], [5, 8], [7, 10], [10, 13], UP, UP],
    N: [DN, [0, 2], [1, 3], [1, 4], [2, 5], [3, 6], [5, 8], [7, 10], [10, 13], UP, UP, UP],
    P: [[0, 2], [1, 3], [1, 4], [2, 5], [3, 6], [5, 8], [7, 10], [10, 13], UP, UP, UP, UP],
    Q: [[1, 3], [1, 4], [2, 5], [3, 6], [5, 8], [7, 10], [10, 13], UP, UP, UP, UP, UP],
    R: [[1, 4], [2, 5], [3, 6], [5, 8], [7, 10], [10, 13], UP, UP, UP, UP, UP, UP],
  },
};

const TABLE_BY_SEVERITY: Readonly<Record<InspectionSeverity, MasterTable>> = {
  normal: NORMAL,
  tightened: TIGHTENED,
  reduced: REDUCED,
};

export interface ResolvedPlan {
  planLetter: CodeLetter;
  sampleSize: number;
  accept: number;
  reject: number;
}

export interface SingleSamplingPlan extends ResolvedPlan {
  /** Table 1's letter for the lot size and level (before following any arrow). */
  codeLetter: CodeLetter;
  /**
   * True when the plan's sample size is >= the lot size: inspect every unit. `sampleSize` is then
   * reported as the lot size (the number of units actually inspected); Ac/Re stay the plan's.
   */
  hundredPercent: boolean;
}

const planInputSchema = z.object({
  lotSize: z.number({ error: "lotSize must be a number" }).int("lotSize must be a whole number").min(1, "lotSize must be at least 1"),
  level: z.enum(INSPECTION_LEVELS, { error: `level must be one of ${INSPECTION_LEVELS.join(", ")}` }),
  aql: z.number({ error: "aql must be a number" }).refine((value) => (PREFERRED_AQLS as readonly number[]).includes(value), {
    error: `aql must be one of the preferred values ${PREFERRED_AQLS.join(", ")}`,
  }),
  severity: z.enum(INSPECTION_SEVERITIES, { error: `severity must be one of ${INSPECTION_SEVERITIES.join(", ")}` }),
});

/** The first problem as a sentence, with the value that was given (e.g. "… (got 2.5)"). */
function firstIssueMessage(error: z.ZodError, input: unknown): string {
  const issue = error.issues[0];
  if (!issue) return "invalid sampling input";
  const given = issue.path.reduce<unknown>((value, key) => (value as Record<PropertyKey, unknown> | undefined)?.[key], input);
  const shown = typeof given === "string" ? JSON.stringify(given) : String(given);
  return issue.path.length ? `${issue.message} (got ${shown})` : issue.message;
}

/** Table 1. A lot of 1 unit uses the first row (2–8); the plan then covers the whole lot. */
export function codeLetterFor(lotSize: number, level: InspectionLevel): CodeLetter {
  const levelIndex = INSPECTION_LEVELS.indexOf(level);
  if (!Number.isInteger(lotSize) || lotSize < 1) throw new SamplingInputError("lotSize must be a whole number of at least 1");
  if (levelIndex < 0) throw new SamplingInputError(`level must be one of ${INSPECTION_LEVELS.join(", ")}`);
  const row = CODE_LETTER_ROWS.find(([maxLot]) => lotSize <= maxLot)!;
  return row[1][levelIndex] as CodeLetter;
}

/** Follows arrows in the chosen master table from (letter, aql) to the plan they lead to. */
export function resolvePlan(letter: CodeLetter, aql: number, severity: InspectionSeverity): ResolvedPlan {
  const table = TABLE_BY_SEVERITY[severity];
  const column = table.columns.indexOf(aql);
  if (column < 0) throw new SamplingInputError(`${table.name} has no column for AQL ${aql}`);
  let rowIndex = CODE_LETTERS.indexOf(letter);
  if (rowIndex < 0) throw new SamplingInputError(`unknown code letter ${letter}`);
  let cell = table.rows[letter][column];
  // Every cell is a plan or an arrow; an arrow sends us one row at a time until a plan is reached.
  while (cell === "down" || cell === "up") {
    rowIndex += cell === "down" ? 1 : -1;
    const next = CODE_LETTERS[rowIndex];
    if (next === undefined) throw new Error(`${table.name}: arrow at ${letter}/${aql} leads off the table`);
    cell = table.rows[next][column];
  }
  const planLetter = CODE_LETTERS[rowIndex];
  return { planLetter, sampleSize: table.sampleSizes[planLetter], accept: cell[0], reject: cell[1] };
}

/**
 * The single sampling plan for a lot: `codeLetter` from Table 1; `planLetter`, `sampleSize`,
 * `accept`, `reject` from the plan actually used after following arrows. Throws SamplingInputError
 * on invalid input.
 */
export function singleSamplingPlan(input: { lotSize: number; level: InspectionLevel; aql: number; severity: InspectionSeverity }): SingleSamplingPlan {
  const parsed = planInputSchema.safeParse(input);
  if (!parsed.success) throw new SamplingInputError(firstIssueMessage(parsed.error, input));
  const { lotSize, level, aql, severity } = parsed.data;
  const codeLetter = codeLetterFor(lotSize, level);
  const plan = resolvePlan(codeLetter, aql, severity);
  const hundredPercent = plan.sampleSize >= lotSize;
  return { codeLetter, ...plan, sampleSize: hundredPercent ? lotSize : plan.sampleSize, hundredPercent };
}

/** The next smaller AQL in the standard's series (0.065 → 0.040), or null below 0.010. */
export function aqlStepTighter(aql: number): number | null {
  const index = (AQL_SERIES as readonly number[]).indexOf(aql);
  if (index < 0) throw new SamplingInputError(`aql must be one of ${AQL_SERIES.join(", ")}`);
  return index === 0 ? null : AQL_SERIES[index - 1];
}

/**
 * Ac of the normal plan with the same sample (same plan letter) one AQL step tighter — what the
 * switching score compares against. Null when that cell is an arrow (never for plans with Ac >= 2).
 */
export function tighterAcceptNumber(planLetter: CodeLetter, aql: number): number | null {
  const tighter = aqlStepTighter(aql);
  const column = tighter === null ? -1 : NORMAL.columns.indexOf(tighter);
  const cell = column < 0 ? undefined : NORMAL.rows[planLetter]?.[column];
  return Array.isArray(cell) ? cell[0] : null;
}

export type LotJudgement = "accept" | "not-accepted" | "accept-reinstate-normal";

/**
 * Verdict for a sample: <= Ac accept, >= Re not accepted; between them (only possible with the gap
 * of the reduced plans) the lot is accepted but normal inspection is reinstated (Z1.4 §10.1.4).
 */
export function judgeLot(plan: { accept: number; reject: number }, found: number): LotJudgement {
  if (!Number.isInteger(found) || found < 0) throw new SamplingInputError("found must be a whole number of at least 0");
  if (found <= plan.accept) return "accept";
  if (found >= plan.reject) return "not-accepted";
  return "accept-reinstate-normal";
}
