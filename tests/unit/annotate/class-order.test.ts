import { describe, expect, it } from "vitest";
import { benchClassOrder, startingClass } from "@/lib/annotate/class-order";
import { createAnnotationState } from "@/lib/annotate/model";
import { handleKey } from "@/lib/annotate/tools";
import { EXAMPLE_PART_TYPES } from "@/lib/grading/example-part-types";

const classesOf = (slug: keyof typeof EXAMPLE_PART_TYPES) => EXAMPLE_PART_TYPES[slug].defects.map((key) => ({ key, severity: EXAMPLE_PART_TYPES[slug].defectSeverities[key] }));

describe("the order the Bench offers classes in", () => {
  it("groups by severity, least severe first, keeping the part type's order inside a group", () => {
    const order = benchClassOrder([
      { key: "swelling", severity: "critical" },
      { key: "dent", severity: "major" },
      { key: "scratch", severity: "minor" },
      { key: "torn-flex", severity: "major" },
      { key: "stain", severity: "minor" },
    ] as const);
    expect(order.map((c) => c.key)).toEqual(["scratch", "stain", "dent", "torn-flex", "swelling"]);
  });

  it("never starts with a critical class: batteries used to start with Swelling on key 1", () => {
    for (const slug of Object.keys(EXAMPLE_PART_TYPES) as (keyof typeof EXAMPLE_PART_TYPES)[]) {
      const classes = classesOf(slug);
      const start = startingClass(classes);
      expect(start, slug).not.toBeNull();
      expect(EXAMPLE_PART_TYPES[slug].defectSeverities[start!], slug).not.toBe("critical");
      expect(benchClassOrder(classes)[0].key, `${slug}: key 1 is the starting class`).toBe(start);
    }
    expect(startingClass(classesOf("battery"))).toBe("scratch");
  });

  it("starts with no class when every class is critical, so drawing waits for a deliberate choice", () => {
    const onlyCritical = [
      { key: "crack", severity: "critical" as const },
      { key: "swelling", severity: "critical" as const },
    ];
    expect(startingClass(onlyCritical)).toBeNull();
    const state = createAnnotationState({ image: { width: 100, height: 100 }, allowedDefects: ["crack", "swelling"], startingDefect: null, idPrefix: "t" });
    expect(state.activeDefect).toBeNull();
    expect(handleKey(state, { key: "b", shift: false, alt: false, mod: false }).state.activeTool).toBe("select"); // Box needs a class
    const chosen = handleKey(state, { key: "2", shift: false, alt: false, mod: false }).state;
    expect(chosen.activeDefect).toBe("swelling");
  });

  it("refuses a starting class the part type does not allow", () => {
    expect(() => createAnnotationState({ image: { width: 10, height: 10 }, allowedDefects: ["dent"], startingDefect: "crack", idPrefix: "t" })).toThrow(RangeError);
  });
});
