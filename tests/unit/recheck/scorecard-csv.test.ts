/**
 * The scorecards' CSV rows and the screen's number formats. Counts by hand (HAND); the CSV format
 * itself (RFC 4180, a) is lib/reports/csv-stream's and tested there.
 */
import { describe, expect, it } from "vitest";
import { csvHeader, csvLines } from "@/lib/reports/csv-stream";
import { buildScorecards, type ScorecardRecheck } from "@/lib/recheck/scorecard";
import { SCORECARD_CSV_COLUMNS, scorecardCsvRows } from "@/lib/recheck/scorecard-csv";
import { calibrationCountText, calibrationVerdictText, type CalibrationResult } from "@/lib/recheck/scorecard-calibration";
import { bandLabel, formatKappa, formatKappaInterval, formatPercent, formatShareInterval } from "@/lib/recheck/scorecard-format";
import { DEFAULT_RECHECK_SETTINGS } from "@/lib/recheck/settings";

const r = (graderId: string, gradedAt: string, firstGrade: ScorecardRecheck["firstGrade"], recheckGrade: ScorecardRecheck["recheckGrade"]): ScorecardRecheck => ({
  graderId,
  gradedAt,
  firstGrade,
  recheckGrade,
  blind: true,
});

// Two weeks (Mondays 1 and 8 June 2026, UTC); "zed" rechecked only in the first week.
const cards = buildScorecards({
  from: "2026-06-01",
  to: "2026-06-14",
  timeZone: "UTC",
  settings: DEFAULT_RECHECK_SETTINGS,
  graded: [
    { graderId: "zed", day: "2026-06-02", count: 7 },
    { graderId: "amy", day: "2026-06-09", count: 3 },
  ],
  rechecks: [
    r("zed", "2026-06-02T10:00:00Z", "A", "A"),
    r("zed", "2026-06-02T11:00:00Z", "B", "C"),
    r("zed", "2026-06-03T11:00:00Z", "B", "B"),
    r("zed", "2026-06-04T11:00:00Z", "C", "C"),
    r("amy", "2026-06-09T09:00:00Z", "A", "B"),
  ],
});
// Calibration: Zed passed one set and failed another; Bea (no grades, so no scorecard) took one.
const attempt = (userId: string, day: string, setName: string, exactShare: number, passed: boolean, failedChecks: CalibrationResult["failedChecks"] = []): CalibrationResult => ({
  attemptId: `${userId}-${day}`,
  userId,
  setId: setName,
  setName,
  day,
  items: 5,
  exactShare,
  passed,
  failedChecks,
});
const calibration = [
  attempt("zed", "2026-06-03", "Housings", 1, true),
  attempt("bea", "2026-06-05", "Housings", 0.8, true),
  attempt("zed", "2026-06-10", "Cameras", 0.4, false, [
    { check: "grade_agreement", value: 0.4, threshold: 0.8 },
    { check: "mean_iou", defect: "scratch", value: 0.3125, threshold: 0.5 },
  ]),
];
const view = { ...cards, names: { zed: "Zed Orrow", amy: "Amy Quell", bea: "Bea Lindqvist" }, calibration };

describe("scorecardCsvRows", () => {
  const rows = scorecardCsvRows(view);

  it("lists each grader by name week by week then their period and calibration attempts, people with attempts only, and the team last", () => {
    expect(rows.map((row) => `${row.who}|${row.period}`)).toEqual([
      "Amy Quell|week of 2026-06-01",
      "Amy Quell|week of 2026-06-08",
      "Amy Quell|2026-06-01..2026-06-14",
      "Zed Orrow|week of 2026-06-01",
      "Zed Orrow|week of 2026-06-08",
      "Zed Orrow|2026-06-01..2026-06-14",
      "Zed Orrow|calibration on 2026-06-03",
      "Zed Orrow|calibration on 2026-06-10",
      "Bea Lindqvist|calibration on 2026-06-05",
      "Team|week of 2026-06-01",
      "Team|week of 2026-06-08",
      "Team|2026-06-01..2026-06-14",
    ]);
  });

  it("writes plain numbers, empty cells for undefined figures, and the drift flag on period rows only", () => {
    const lines = (csvHeader(SCORECARD_CSV_COLUMNS, { bom: false }) + csvLines(SCORECARD_CSV_COLUMNS, rows)).split("\r\n");
    const header = lines[0].split(",");
    const cell = (line: string, column: string) => line.split(",")[header.indexOf(column)];
    const zedPeriod = lines.find((line) => line.startsWith("Zed Orrow,zed,2026-06-01..2026-06-14"))!;
    // HAND: zed 4 rechecks, 3 the same grade → 0.75; all within one step → 1; 7 graded.
    expect(cell(zedPeriod, "graded")).toBe("7");
    expect(cell(zedPeriod, "n")).toBe("4");
    expect(cell(zedPeriod, "exact_agreement")).toBe("0.75");
    expect(cell(zedPeriod, "within_one")).toBe("1");
    expect(cell(zedPeriod, "drift_flagged")).toBe("false");
    // Zed's second week has no rechecks: no figure, not a zero; week rows carry no drift flag.
    const zedEmptyWeek = lines.find((line) => line.startsWith("Zed Orrow,zed,week of 2026-06-08"))!;
    expect(cell(zedEmptyWeek, "n")).toBe("0");
    expect(cell(zedEmptyWeek, "exact_agreement")).toBe("");
    expect(cell(zedEmptyWeek, "kappa")).toBe("");
    expect(cell(zedEmptyWeek, "drift_flagged")).toBe("");
    // HAND: team 5 rechecks, 3 the same → 0.6.
    expect(
      cell(
        lines.find((line) => line.startsWith("Team,,2026-06-01..2026-06-14"))!,
        "exact_agreement",
      ),
    ).toBe("0.6");
  });

  it("writes a calibration attempt's set, items, agreement, verdict and failed checks; its recheck columns stay empty", () => {
    const lines = (csvHeader(SCORECARD_CSV_COLUMNS, { bom: false }) + csvLines(SCORECARD_CSV_COLUMNS, rows)).split("\r\n");
    const header = lines[0].split(",");
    expect(header.slice(-5)).toEqual(["calibration_set", "calibration_items", "calibration_grade_agreement", "calibration_passed", "calibration_failed_checks"]);
    const failed = lines.find((line) => line.startsWith("Zed Orrow,zed,calibration on 2026-06-10"))!.split(",");
    const cell = (column: string) => failed[header.indexOf(column)];
    expect([cell("graded"), cell("n"), cell("exact_agreement"), cell("drift_flagged")]).toEqual(["", "", "", ""]);
    expect([cell("calibration_set"), cell("calibration_items"), cell("calibration_grade_agreement"), cell("calibration_passed")]).toEqual(["Cameras", "5", "0.4", "false"]);
    expect(cell("calibration_failed_checks")).toBe("grade agreement 40 % (needs 80 %); mean IoU of scratch 0.31 (needs 0.50)");
  });
});

describe("calibration results in words", () => {
  it("counts passes per person and says why an attempt failed (HAND)", () => {
    expect(calibrationCountText(calibration.filter((a) => a.userId === "zed"))).toBe("1 of 2 passed");
    expect(calibrationCountText([])).toBe("—");
    expect(calibrationVerdictText(calibration[0])).toBe("Passed");
    expect(calibrationVerdictText(calibration[2], (d) => (d === "scratch" ? "Scratch" : d))).toBe("Failed: grade agreement 40 % (needs 80 %); mean IoU of Scratch 0.31 (needs 0.50)");
  });
});

describe("scorecard number formats", () => {
  it("prints shares, kappas and bands, and n/a for what is undefined", () => {
    expect(formatPercent(0.834)).toBe("83 %");
    expect(formatPercent(Number.NaN)).toBe("n/a");
    expect(formatPercent(null)).toBe("n/a");
    expect(formatShareInterval({ share: 0.75, low: 0.3006, high: 0.9544, n: 4 })).toBe("75 % (30–95 %)");
    expect(formatKappa(-0.125)).toBe("−0.13");
    expect(formatKappaInterval({ kappa: 0.5, low: 0.1, high: 0.9, standardError: 0.2, n: 9, band: "moderate" })).toBe("0.50 (0.10 to 0.90)");
    expect(formatKappaInterval({ kappa: Number.NaN, low: Number.NaN, high: Number.NaN, standardError: Number.NaN, n: 0, band: null })).toBe("n/a");
    expect(bandLabel({ band: "almost perfect" })).toBe("Almost perfect");
    expect(bandLabel({ band: null })).toBe("n/a");
  });
});
