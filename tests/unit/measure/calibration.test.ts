import { describe, expect, it } from "vitest";
import { calibratePhoto, calibrationFromRuler, shapesBoundingBox } from "@/lib/measure/calibration";

// Distances: Pythagoras with the 3-4-5 triple scaled by 30 → 150 px (a: elementary geometry).
const ruler150 = { a: [10, 20] as [number, number], b: [100, 140] as [number, number], lengthMm: 12.5 };

describe("calibrationFromRuler", () => {
  it("divides the ruler's pixel length by its millimetres", () => {
    expect(calibrationFromRuler(ruler150)).toBeCloseTo(12, 12); // 150 px / 12.5 mm (a: Pythagoras)
  });

  it("rejects a zero-length ruler and non-positive or missing millimetres", () => {
    expect(() => calibrationFromRuler({ a: [5, 5], b: [5, 5], lengthMm: 10 })).toThrow(/at least 1 px/);
    expect(() => calibrationFromRuler({ ...ruler150, lengthMm: 0 })).toThrow(/greater than 0/);
    expect(() => calibrationFromRuler({ ...ruler150, lengthMm: -3 })).toThrow(/greater than 0/);
    expect(() => calibrationFromRuler({ ...ruler150, lengthMm: Number.NaN })).toThrow(/Invalid ruler/);
    expect(() => calibrationFromRuler({ ...ruler150, a: [Number.POSITIVE_INFINITY, 0] })).toThrow(/Invalid ruler/);
  });
});

describe("calibratePhoto — rulers", () => {
  it("one ruler: method ruler, human detail", () => {
    expect(calibratePhoto({ rulers: [ruler150] })).toEqual({
      method: "ruler",
      pxPerMm: 12,
      detail: "Ruler: 150.0 px over 12.5 mm = 12.00 px/mm.",
    });
  });

  it("several rulers are pooled as Σ px / Σ mm and their spread is reported", () => {
    // 150 px / 12.5 mm = 12.00 and 100 px / 8 mm = 12.50 → 250 / 20.5 = 12.195…; spread 0.5 / 12.195 = 4.1 %.
    const second = { a: [0, 0] as [number, number], b: [60, 80] as [number, number], lengthMm: 8 }; // 6-8-10 × 10 (a)
    const calibration = calibratePhoto({ rulers: [ruler150, second] });
    expect(calibration.method).toBe("ruler");
    expect(calibration.pxPerMm).toBeCloseTo(250 / 20.5, 12);
    expect(calibration.detail).toContain("2 rulers pooled: 250.0 px over 20.5 mm = 12.20 px/mm");
    expect(calibration.detail).toContain("single rulers 12.00–12.50 px/mm, spread 4.1 %");
    expect(calibration.detail).not.toContain("disagree");
  });

  it("warns when rulers disagree by more than 5 % and names the bad ruler on error", () => {
    const off = { a: [0, 0] as [number, number], b: [0, 130] as [number, number], lengthMm: 10 }; // 13 px/mm
    expect(calibratePhoto({ rulers: [ruler150, off] }).detail).toContain("disagree by more than 5 %");
    expect(() => calibratePhoto({ rulers: [ruler150, { ...off, lengthMm: 0 }] })).toThrow(/Ruler 2: Invalid ruler/);
  });

  it("a ruler wins over the nominal size", () => {
    const calibration = calibratePhoto({
      rulers: [ruler150],
      surface: [{ kind: "rect", x: 0, y: 0, width: 2100, height: 2970 }],
      nominalSizeMm: { width: 210, height: 297 },
    });
    expect(calibration.method).toBe("ruler");
  });
});

describe("calibratePhoto — nominal size against the Surface", () => {
  // ISO 216 A4 is 210 × 297 mm (a: ISO 216); ISO/IEC 7810 ID-1 cards are 85.60 × 53.98 mm (a).
  it("A4 outline drawn 2100 × 2970 px gives 10 px/mm, upright or turned by 90°", () => {
    const upright = calibratePhoto({ rulers: [], surface: [{ kind: "rect", x: 50, y: 40, width: 2100, height: 2970 }], nominalSizeMm: { width: 210, height: 297 } });
    const turned = calibratePhoto({ rulers: [], surface: [{ kind: "rect", x: 50, y: 40, width: 2970, height: 2100 }], nominalSizeMm: { width: 210, height: 297 } });
    expect(upright).toMatchObject({ method: "nominal" });
    expect(upright.pxPerMm).toBeCloseTo(10, 12);
    expect(turned.pxPerMm).toBeCloseTo(10, 12);
    expect(turned.detail).toContain("long side to long side");
  });

  it("ID-1 card as a polygon, turned by 90°: matched long side to long side (not width to width)", () => {
    const polygon = {
      kind: "polygon" as const,
      points: [
        [100, 100],
        [639.8, 100],
        [639.8, 956],
        [100, 956],
      ] as [number, number][],
    };
    const calibration = calibratePhoto({ rulers: [], surface: [polygon], nominalSizeMm: { width: 85.6, height: 53.98 } });
    expect(calibration.pxPerMm).toBeCloseTo(10, 9);
    expect(calibration.detail).toContain("Surface box 539.8 × 856.0 px against 85.6 × 54.0 mm");
  });

  it("averages the two sides and warns when they disagree (tilted or wrong part)", () => {
    const calibration = calibratePhoto({ rulers: [], surface: [{ kind: "rect", x: 0, y: 0, width: 1000, height: 1000 }], nominalSizeMm: { width: 100, height: 50 } });
    expect(calibration.pxPerMm).toBeCloseTo(15, 12); // (1000/100 + 1000/50) / 2
    expect(calibration.detail).toContain("disagree by more than 5 %");
  });

  it("bounding box spans several shapes, line half-widths and spot radii", () => {
    expect(
      shapesBoundingBox([
        {
          kind: "line",
          points: [
            [10, 10],
            [50, 10],
          ],
          width: 4,
        },
        { kind: "spot", x: 80, y: 30, radius: 5 },
      ]),
    ).toEqual({ minX: 8, minY: 8, maxX: 85, maxY: 35 });
    expect(shapesBoundingBox([])).toBeNull();
  });

  it("falls back to none with a reason, and rejects a non-positive nominal size", () => {
    expect(calibratePhoto({ rulers: [] })).toEqual({ method: "none", pxPerMm: null, detail: "Not calibrated: no Ruler and no Surface or nominal size; lengths and areas stay in pixels." });
    expect(calibratePhoto({ rulers: [], nominalSizeMm: { width: 10, height: 5 } }).detail).toContain("no Surface is marked");
    expect(calibratePhoto({ rulers: [], surface: [{ kind: "rect", x: 0, y: 0, width: 9, height: 9 }] }).detail).toContain("no nominal size");
    expect(calibratePhoto({ rulers: [], surface: [{ kind: "spot", x: 5, y: 5, radius: 0 }], nominalSizeMm: { width: 10, height: 5 } }).method).toBe("none");
    expect(() => calibratePhoto({ rulers: [], surface: [{ kind: "rect", x: 0, y: 0, width: 9, height: 9 }], nominalSizeMm: { width: 0, height: 5 } })).toThrow(/nominal width/);
  });
});
