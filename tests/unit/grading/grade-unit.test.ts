/**
 * Measuring a unit and grading it, and grading stored measurements again under another rubric
 * version. Thresholds are (c) invented examples (lib/grading/example-rubrics.ts); the expected
 * shares are hand computations from rectangle areas (a: geometry) noted beside each check.
 */
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { DeadlineExceeded, functionalFailureCounts, measureUnit, regradeStored, type GradingPartTypeInput, type UnitPhotoInput } from "@/lib/grading/grade-unit";
import type { Rubric } from "@/lib/grading/rubric-schema";

const partType: GradingPartTypeInput = {
  views: [
    {
      key: "lens",
      label: "Lens",
      required: true,
      zones: [
        {
          id: "lens-window",
          label: "lens window",
          polygon: [
            [0, 0],
            [0.5, 0],
            [0.5, 1],
            [0, 1],
          ],
        },
      ],
    },
    { key: "back", label: "Back", required: true, zones: [] },
  ],
  defectClasses: [
    { key: "scratch", label: "scratch", severity: "major" },
    { key: "crack", label: "crack", severity: "critical" },
  ],
  nominalSizeMm: { width: 20, height: 10 },
  panelResolution: null,
};

const rubricV1: Rubric = {
  rules: [
    { id: "lens-scratch-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" },
    { id: "lens-scratch-c", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 1, grade: "C" },
    { id: "func-major", metric: "functionalFailures", severity: "major", comparison: ">", threshold: 0, grade: "C" },
  ],
};

// The Surface is 200 × 100 px (20 × 10 mm nominal → 10 px/mm); the lens window is its left half,
// 100 × 100 = 10 000 px. A 12 × 10 px scratch box at (60, 60), inside that half, covers
// 120 / 10 000 = 1.2 % of it.
const lensPhoto = (scratch: { width: number; height: number } | null, version = 3): UnitPhotoInput => ({
  photoId: "photo-lens",
  viewKey: "lens",
  width: 300,
  height: 200,
  regionsVersion: version,
  defects: scratch ? [{ id: "s1", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, ...scratch } }] : [],
  surfaces: [
    {
      kind: "polygon",
      points: [
        [50, 50],
        [250, 50],
        [250, 150],
        [50, 150],
      ],
    },
  ],
  rulers: [],
});
const backPhoto: UnitPhotoInput = { ...lensPhoto(null, 1), photoId: "photo-back", viewKey: "back" };
const noFailures = { critical: 0, major: 0, minor: 0 };

describe("measureUnit", () => {
  it("measures every photo, keeps the regions versions read and proposes a grade with explanations", async () => {
    const outcome = await measureUnit({ partType, rubric: rubricV1, photos: [lensPhoto({ width: 12, height: 10 }), backPhoto], functionalFailures: noFailures });
    expect(outcome.regionsVersions).toEqual({ "photo-lens": 3, "photo-back": 1 });
    const lens = outcome.photos[0].measurement;
    expect(lens.calibration.method).toBe("nominal");
    expect(lens.byZone["lens-window"].zonePx).toBe(10_000);
    expect(lens.byZone["lens-window"].byDefect.scratch.share).toBeCloseTo(0.012, 12);
    expect(lens.byDefect.scratch.areaMm2).toBeCloseTo(1.2, 9); // 120 px / (10 px/mm)²
    expect(outcome.unit.proposal.grade).toBe("C");
    expect(outcome.unit.proposal.lines.map((l) => l.text)).toEqual(["scratch covers 1.2 % of lens window > 1.0 % allowed for B → C", "scratch covers 1.2 % of lens window > 0.5 % allowed for A → B"]);
    expect(outcome.unit.defectSeverities).toEqual({ scratch: "major", crack: "critical" });
  });

  it("rejects a critical defect through the built-in rule and counts failed checklist items", async () => {
    const cracked = lensPhoto(null);
    cracked.defects = [
      {
        id: "c1",
        defect: "crack",
        shape: {
          kind: "line",
          points: [
            [60, 60],
            [90, 100],
          ],
          width: 2,
        },
      },
    ];
    const outcome = await measureUnit({ partType, rubric: rubricV1, photos: [cracked], functionalFailures: { critical: 0, major: 1, minor: 0 } });
    expect(outcome.unit.proposal.grade).toBe("Reject");
    expect(outcome.unit.proposal.lines[0].text).toBe("crack found (1 region): a critical defect for this part type → Reject");
    expect(outcome.unit.proposal.lines[1].text).toBe("major functional failures 1 > 0 allowed for B → C");
    // 30-40-50 triangle → 50 px at 10 px/mm = 5 mm (a: Pythagoras).
    expect(outcome.photos[0].measurement.byDefect.crack.maxLengthMm).toBeCloseTo(5, 9);
  });

  it("refuses a unit without photos and stops at the deadline between photos", async () => {
    await expect(measureUnit({ partType, rubric: rubricV1, photos: [], functionalFailures: noFailures })).rejects.toThrow(AppError);
    await expect(measureUnit({ partType, rubric: rubricV1, photos: [backPhoto], functionalFailures: noFailures, deadline: Date.now() - 1 })).rejects.toBeInstanceOf(DeadlineExceeded);
  });

  it("notes a photo whose view the part type does not have", async () => {
    const outcome = await measureUnit({ partType, rubric: rubricV1, photos: [{ ...backPhoto, viewKey: "side" }], functionalFailures: noFailures });
    expect(outcome.photos[0].notes.join(" ")).toMatch(/View "side" is not one of this part type's views/);
  });
});

describe("regradeStored", () => {
  it("grades the same stored measurement under another version without measuring again", async () => {
    const outcome = await measureUnit({ partType, rubric: rubricV1, photos: [lensPhoto({ width: 12, height: 10 })], functionalFailures: noFailures });
    const stored = { ...outcome.unit, checklistStamp: null };
    const v2: Rubric = { rules: rubricV1.rules.map((rule) => (rule.id === "lens-scratch-c" && rule.metric === "share" ? { ...rule, threshold: 2 } : rule)) };
    const under2 = regradeStored({ rubric: v2, photos: outcome.photos.map((p) => p.measurement), unit: stored });
    expect(under2.grade).toBe("B");
    expect(under2.lines.map((l) => l.text)).toEqual(["scratch covers 1.2 % of lens window > 0.5 % allowed for A → B"]);
    // The stored proposal is untouched.
    expect(stored.proposal.grade).toBe("C");
  });
});

describe("functionalFailureCounts", () => {
  it("counts only failed items, per severity", () => {
    expect(
      functionalFailureCounts([
        { passed: false, severityOnFail: "critical" },
        { passed: true, severityOnFail: "critical" },
        { passed: false, severityOnFail: "minor" },
        { passed: false, severityOnFail: "minor" },
      ]),
    ).toEqual({ critical: 1, major: 0, minor: 2 });
  });
});
