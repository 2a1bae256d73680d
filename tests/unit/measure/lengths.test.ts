import { describe, expect, it } from "vitest";
import type { Calibration } from "@/lib/measure/types";
import { areaPxToMm2, lineLengthMm, lineLengthPx, pxToMm, spotDiameterMm, spotDiameterPx } from "@/lib/measure/lengths";

const twelve: Calibration = { method: "ruler", pxPerMm: 12, detail: "" };
const none: Calibration = { method: "none", pxPerMm: null, detail: "" };

describe("lengths", () => {
  it("sums the segments of a Line's centre line", () => {
    // 3-4-5 triple × 10 = 50 px, then a vertical 60 px (a: Pythagoras).
    const line = {
      kind: "line" as const,
      points: [
        [0, 0],
        [30, 40],
        [30, 100],
      ] as [number, number][],
      width: 8,
    };
    expect(lineLengthPx(line)).toBe(110);
    expect(lineLengthMm(line, twelve)).toBeCloseTo(110 / 12, 12);
    expect(lineLengthMm(line, none)).toBeNull();
  });

  it("spot diameters in px and mm", () => {
    const spot = { kind: "spot" as const, x: 5, y: 5, radius: 6 };
    expect(spotDiameterPx(spot)).toBe(12);
    expect(spotDiameterMm(spot, twelve)).toBe(1);
    expect(spotDiameterMm(spot, none)).toBeNull();
  });

  it("areas scale with the square of px/mm: 144 px² is 1 mm² at 12 px/mm (a: definition of a scale)", () => {
    expect(areaPxToMm2(144, twelve)).toBe(1);
    expect(areaPxToMm2(36_000, { method: "nominal", pxPerMm: 6, detail: "" })).toBe(1000);
    expect(areaPxToMm2(144, none)).toBeNull();
    expect(pxToMm(24, twelve)).toBe(2);
  });

  it("rejects malformed shapes and numbers", () => {
    expect(() => lineLengthPx({ kind: "line", points: [[0, 0]], width: 1 })).toThrow(/at least two points/);
    expect(() =>
      lineLengthPx({
        kind: "line",
        points: [
          [0, 0],
          [Number.NaN, 1],
        ],
        width: 1,
      }),
    ).toThrow(/finite/);
    expect(() => spotDiameterPx({ kind: "spot", x: 0, y: 0, radius: -1 })).toThrow(/negative/);
    expect(() => areaPxToMm2(-5, twelve)).toThrow(/negative/);
    expect(() => pxToMm(5, { method: "ruler", pxPerMm: 0, detail: "" })).toThrow(/positive/);
  });
});
