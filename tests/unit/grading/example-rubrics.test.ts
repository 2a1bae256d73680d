/**
 * The example rubrics: each validates against its example part type and grades a clean unit A.
 * Their thresholds are (c) common practice / invented examples; the battery caution text is the
 * one in the README ("Cautions").
 */
import { describe, expect, it } from "vitest";
import { evaluateRubric } from "@/lib/grading/evaluate";
import { EXAMPLE_LABELS, EXAMPLE_PART_TYPES, EXAMPLE_PART_TYPE_SLUGS } from "@/lib/grading/example-part-types";
import { BATTERY_CAUTION, EXAMPLE_RUBRICS } from "@/lib/grading/example-rubrics";
import { parseRubric } from "@/lib/grading/rubric-schema";
import { buildUnitMetrics } from "@/lib/grading/unit-metrics";
import { noFailures, photo } from "./fixtures";

const SEEDED_DEFECTS = ["scratch", "crack", "dent", "chip", "pixel-lit", "pixel-dark", "pixel-subpixel", "moisture", "dust", "corrosion", "screw-boss", "torn-flex", "swelling", "stain"];

/** One calibrated, defect-free photo per view, every zone present, pixel class I on screen views. */
const cleanUnit = (slug: keyof typeof EXAMPLE_PART_TYPES) => {
  const partType = EXAMPLE_PART_TYPES[slug];
  const zones = Object.fromEntries((partType.zones ?? []).map((zone) => [zone, {}]));
  return buildUnitMetrics({
    photos: (partType.views ?? []).map((viewKey) => photo({ photoId: `clean-${viewKey}`, viewKey, zones, pixelClass: viewKey.startsWith("screen-") ? "I" : undefined })),
    functionalFailures: noFailures,
  });
};

describe("example rubrics", () => {
  it("cover every seeded part type", () => {
    expect(Object.keys(EXAMPLE_RUBRICS).sort()).toEqual([...EXAMPLE_PART_TYPE_SLUGS].sort());
  });

  for (const slug of EXAMPLE_PART_TYPE_SLUGS) {
    describe(slug, () => {
      const partType = EXAMPLE_PART_TYPES[slug];
      const rubric = EXAMPLE_RUBRICS[slug];

      it("validates against its part type, using only seeded defect keys", () => {
        expect(parseRubric(rubric, partType)).toEqual({ ok: true, rubric });
        for (const defect of partType.defects) expect(SEEDED_DEFECTS).toContain(defect);
        for (const defect of Object.keys(partType.defectSeverities)) expect(partType.defects).toContain(defect);
      });

      it("is marked as an invented example", () => {
        expect(rubric.notes?.some((note) => note.includes("(c) common practice / invented examples"))).toBe(true);
      });

      it("grades a clean unit A with nothing left unevaluated", () => {
        const result = evaluateRubric({ rubric, metrics: cleanUnit(slug), defectSeverities: partType.defectSeverities, labels: EXAMPLE_LABELS });
        expect(result).toEqual({
          grade: "A",
          lines: [{ ruleId: "builtin:none", grade: "A", text: "No rule fired: grade A", value: null, threshold: null }],
          notes: [],
          unevaluatedRuleIds: [],
        });
      });

      it("rejects a unit with a failed critical functional check", () => {
        const metrics = { ...cleanUnit(slug), functionalFailures: { critical: 1, major: 0, minor: 0 } };
        expect(evaluateRubric({ rubric, metrics, defectSeverities: partType.defectSeverities }).grade).toBe("Reject");
      });
    });
  }

  it("battery: swelling is critical, rejects, and the rubric carries the fire-risk caution", () => {
    expect(EXAMPLE_PART_TYPES.battery.defectSeverities.swelling).toBe("critical");
    expect(BATTERY_CAUTION).toBe(
      "Swollen, punctured or hot lithium cells are a fire risk: isolate in a fire-safe container, do not charge or press; follow local hazardous-waste and transport rules.",
    );
    expect(EXAMPLE_RUBRICS.battery.notes?.[0]).toBe(BATTERY_CAUTION);
    const swollen = buildUnitMetrics({
      photos: [photo({ photoId: "side", viewKey: "front", zones: { body: {}, contacts: {} }, defects: { swelling: { share: 0.3, count: 1 } } })],
      functionalFailures: noFailures,
    });
    const result = evaluateRubric({ rubric: EXAMPLE_RUBRICS.battery, metrics: swollen, defectSeverities: EXAMPLE_PART_TYPES.battery.defectSeverities });
    expect(result.grade).toBe("Reject");
    expect(result.lines.map((l) => l.text)).toEqual(["swelling found (1 region): a critical defect for this part type → Reject", "swelling count 1 > 0 allowed for C → Reject"]);
  });

  it("rear camera: a light lens scratch is B, a heavy one C, with readable lines", () => {
    const lens = (share: number) =>
      buildUnitMetrics({
        photos: [photo({ photoId: "lens", viewKey: "lens", zones: { "lens-window": { byDefect: { scratch: { share } } } } })],
        functionalFailures: noFailures,
      });
    const run = (share: number) =>
      evaluateRubric({ rubric: EXAMPLE_RUBRICS["rear-camera"], metrics: lens(share), defectSeverities: EXAMPLE_PART_TYPES["rear-camera"].defectSeverities, labels: EXAMPLE_LABELS });
    expect(run(0.003).lines.map((l) => l.text)).toEqual(["scratch covers 0.3 % of lens window > 0.2 % allowed for A → B"]);
    const heavy = run(0.02);
    expect(heavy.grade).toBe("C");
    expect(heavy.lines.map((l) => l.text)).toEqual(["scratch covers 2.0 % of lens window > 1.0 % allowed for B → C", "scratch covers 2.0 % of lens window > 0.2 % allowed for A → B"]);
  });
});
