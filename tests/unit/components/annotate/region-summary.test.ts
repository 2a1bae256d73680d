import { describe, expect, it } from "vitest";
import { formatPx, regionKindLabel, regionSizeSummary } from "@/components/annotate/region-summary";
import type { Region } from "@/lib/annotate/types";

describe("region size summaries (original px)", () => {
  it("gives a box its width and height", () => {
    expect(regionSizeSummary({ id: "a", role: "defect", defect: "dent", shape: { kind: "rect", x: 1, y: 2, width: 120, height: 80.4 } })).toBe("120 × 80 px");
  });

  // (c) Shoelace formula on the 3-4-5 right triangle: area 3·4/2 = 6; perimeter path 3 + 4 = 7.
  it("gives an outline its area and point count", () => {
    expect(
      regionSizeSummary({
        id: "a",
        role: "defect",
        defect: "chip",
        shape: {
          kind: "polygon",
          points: [
            [0, 0],
            [3, 0],
            [0, 4],
          ],
        },
      }),
    ).toBe("6 px², 3 points");
  });

  it("gives a line its length along the vertices and its width", () => {
    expect(
      regionSizeSummary({
        id: "a",
        role: "defect",
        defect: "scratch",
        shape: {
          kind: "line",
          points: [
            [0, 0],
            [3, 0],
            [3, 4],
          ],
          width: 2.5,
        },
      }),
    ).toBe("7 px long, 2.5 px wide");
    expect(
      regionSizeSummary({
        id: "a",
        role: "defect",
        defect: "scratch",
        shape: {
          kind: "line",
          points: [
            [0, 0],
            [300, 400],
          ],
          width: 4,
        },
      }),
    ).toBe("500 px long, 4 px wide");
  });

  it("gives a spot its radius and a surface its area", () => {
    expect(regionSizeSummary({ id: "a", role: "defect", defect: "dust", shape: { kind: "spot", x: 5, y: 5, radius: 2.25 } })).toBe("radius 2.3 px");
    const surface: Region = {
      id: "s",
      role: "surface",
      shape: {
        kind: "polygon",
        points: [
          [0, 0],
          [2000, 0],
          [2000, 1500],
          [0, 1500],
        ],
      },
    };
    expect(regionSizeSummary(surface)).toBe("3\u2009000\u2009000 px², 4 points");
  });

  it("gives the ruler its pixel length, its millimetres and the scale", () => {
    const ruler: Region = { id: "r", role: "ruler", ruler: { a: [100, 100], b: [400, 500], lengthMm: 20 } };
    expect(regionSizeSummary(ruler)).toBe("500 px = 20 mm (25 px/mm)");
  });

  it("names each region by the tool that drew it", () => {
    expect(regionKindLabel({ id: "a", role: "defect", defect: "dent", shape: { kind: "rect", x: 0, y: 0, width: 1, height: 1 } })).toBe("Box");
    expect(regionKindLabel({ id: "a", role: "defect", defect: "dent", shape: { kind: "polygon", points: [] } })).toBe("Outline");
    expect(regionKindLabel({ id: "a", role: "defect", defect: "dent", shape: { kind: "line", points: [], width: 1 } })).toBe("Line");
    expect(regionKindLabel({ id: "a", role: "defect", defect: "dent", shape: { kind: "spot", x: 0, y: 0, radius: 1 } })).toBe("Spot");
    expect(regionKindLabel({ id: "s", role: "surface", shape: { kind: "polygon", points: [] } })).toBe("Surface");
    expect(regionKindLabel({ id: "r", role: "ruler", ruler: { a: [0, 0], b: [1, 1], lengthMm: 1 } })).toBe("Ruler");
  });
});

describe("formatPx", () => {
  it("keeps one decimal below 10 and groups thousands with a thin space", () => {
    expect(formatPx(2.25)).toBe("2.3");
    expect(formatPx(9.96)).toBe("10");
    expect(formatPx(12.5)).toBe("13");
    expect(formatPx(1234567)).toBe("1\u2009234\u2009567");
    expect(formatPx(-1500)).toBe("−1\u2009500");
    expect(formatPx(Number.NaN)).toBe("–");
  });
});
