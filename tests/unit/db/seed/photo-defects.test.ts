import { describe, expect, it } from "vitest";
import { classKeyOf, surfacePolygon, type PlantedDefect } from "@/db/seed/photo-defects";
import { PART_TYPE_CATALOGUE } from "@/lib/part-types/starter-catalogue";

// Every mark the seed can plant, as PlantedDefect lists them.
const PLANTED: PlantedDefect[] = ["scratch", "crack", "stain", "dust", "dent", "chip", "corrosion", "swelling", "torn-flex", "dead-pixel", "stuck-pixel"];

describe("classKeyOf", () => {
  it("names every planted mark by a class some starter part type has, so seeded models and gallery items show labels, not raw keys", () => {
    const classKeys = new Set(PART_TYPE_CATALOGUE.flatMap((p) => p.defectClasses.map((d) => d.key)));
    for (const defect of PLANTED) expect(classKeys, defect).toContain(classKeyOf(defect));
  });

  it("names pixel faults by what the pixel does", () => {
    expect(classKeyOf("dead-pixel")).toBe("pixel-dark");
    expect(classKeyOf("stuck-pixel")).toBe("pixel-lit");
    expect(classKeyOf("scratch")).toBe("scratch");
  });
});

describe("surfacePolygon", () => {
  it("gives a planted part's outline as the polygon of its four corners, clockwise from the top left", () => {
    expect(surfacePolygon({ kind: "rect", x: 10, y: 20, width: 30, height: 40 })).toEqual({
      kind: "polygon",
      points: [
        [10, 20],
        [40, 20],
        [40, 60],
        [10, 60],
      ],
    });
  });
});
