/**
 * Part type schema and the seeded catalogue. The catalogue's keys must be those the example rubrics
 * assume (lib/grading/example-part-types.ts); battery limits follow docs/references.md (a: 4.20–4.40 V full
 * charge, about 3.0 V cut-off; c: 80 % health).
 */
import { describe, expect, it } from "vitest";
import { PART_TYPE_CATALOGUE } from "@/lib/part-types/starter-catalogue";
import { EXAMPLE_PART_TYPES, EXAMPLE_PART_TYPE_SLUGS } from "@/lib/grading/example-part-types";
import { EXAMPLE_RUBRICS } from "@/lib/grading/example-rubrics";
import { validateRubricAgainstPartType } from "@/lib/grading/rubric-schema";
import { partTypeLists, partTypeSchema, partTypeUpdateSchema } from "@/lib/part-types/schemas";

const battery = PART_TYPE_CATALOGUE.find((p) => p.slug === "battery")!;
const { slug: _slug, ...batteryInput } = battery;

describe("the seeded part types", () => {
  it("are the eight example part types", () => {
    expect(PART_TYPE_CATALOGUE.map((p) => p.slug).sort()).toEqual([...EXAMPLE_PART_TYPE_SLUGS].sort());
  });

  for (const entry of PART_TYPE_CATALOGUE) {
    it(`${entry.slug}: valid, with the example's views, zones and defect severities, and its rubric fits`, () => {
      const { slug, ...input } = entry;
      const parsed = partTypeSchema.safeParse(input);
      expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
      const example = EXAMPLE_PART_TYPES[slug];
      const lists = partTypeLists(entry);
      expect(lists.views).toEqual(example.views);
      expect([...lists.zones].sort()).toEqual([...(example.zones ?? [])].sort());
      expect(Object.fromEntries(entry.defectClasses.map((d) => [d.key, d.severity]))).toEqual(example.defectSeverities);
      expect(validateRubricAgainstPartType(EXAMPLE_RUBRICS[slug], lists)).toEqual([]);
      expect(entry.checklist.length).toBeGreaterThanOrEqual(4);
    });
  }

  it("battery: swelling and heat are critical; voltage limits 3.00–4.40 V; every battery item carries a caution or is a reading", () => {
    const items = Object.fromEntries(battery.checklist.map((i) => [i.id, i]));
    expect(items.swelling).toMatchObject({ kind: "pass_fail", severityOnFail: "critical" });
    expect(items["not-hot"]).toMatchObject({ severityOnFail: "critical" });
    expect(items.ocv).toMatchObject({ kind: "numeric", unit: "V", min: 3.0, max: 4.4, decimals: 2 });
    expect(items.health).toMatchObject({ min: 80 });
    expect(items.swelling.caution).toMatch(/fire risk/);
  });
});

describe("partTypeSchema refuses", () => {
  const refuse = (change: (input: typeof batteryInput) => unknown, message: RegExp) => {
    const result = partTypeSchema.safeParse(change(structuredClone(batteryInput)));
    expect(result.success).toBe(false);
    expect(result.error!.issues.map((i) => i.message).join(" | ")).toMatch(message);
  };
  it("duplicate keys", () => {
    refuse((p) => ({ ...p, checklist: [...p.checklist, p.checklist[0]] }), /appears twice/);
    refuse((p) => ({ ...p, defectClasses: [...p.defectClasses, p.defectClasses[0]] }), /appears twice/);
    refuse((p) => ({ ...p, views: [...p.views, p.views[0]] }), /appears twice/);
  });
  it("limits that contradict each other or carry more decimals than recorded", () => {
    refuse((p) => ({ ...p, checklist: [{ ...p.checklist[3], min: 5, max: 4 }] }), /maximum must not be below/);
    refuse((p) => ({ ...p, checklist: [{ ...p.checklist[3], min: 3.001 }] }), /more decimals/);
  });
  it("zone points outside 0..1, choice items where nothing passes, unknown fields and kinds", () => {
    refuse(
      (p) => ({
        ...p,
        views: [
          {
            ...p.views[0],
            zones: [
              {
                id: "body",
                label: "Body",
                polygon: [
                  [0, 0],
                  [1.2, 0],
                  [1, 1],
                ],
              },
            ],
          },
        ],
      }),
      /run from 0 to 1/,
    );
    refuse(
      (p) => ({
        ...p,
        checklist: [
          {
            id: "x",
            label: "X",
            kind: "choice",
            severityOnFail: "minor",
            options: [
              { value: "a", label: "A", passes: false },
              { value: "b", label: "B", passes: false },
            ],
          },
        ],
      }),
      /At least one choice must pass/,
    );
    refuse((p) => ({ ...p, colour: "red" }), /Unknown|unrecognized/i);
    refuse((p) => ({ ...p, checklist: [{ id: "x", label: "X", kind: "slider", severityOnFail: "minor" }] }), /kind/);
    refuse((p) => ({ ...p, views: [] }), /at least one view/);
  });
  it("updates change only what is sent (no defaults fill in)", () => {
    expect(partTypeUpdateSchema.parse({ name: "Renamed" })).toEqual({ name: "Renamed" });
    expect(partTypeUpdateSchema.safeParse({}).success).toBe(false);
  });
});
