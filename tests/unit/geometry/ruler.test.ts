import { describe, expect, it } from "vitest";
import { MAX_RULER_LENGTH_MM } from "@/lib/geometry/limits";
import { checkRulerLength, parseRulerLength, rulerLengthPx, rulerPxPerMm } from "@/lib/geometry/ruler";

describe("ruler", () => {
  it("gives pixels per millimetre from the marked length", () => {
    // 3-4-5: (0,0)→(300,400) is 500 px; over 25 mm that is 20 px/mm.
    const ruler = { a: [0, 0] as [number, number], b: [300, 400] as [number, number], lengthMm: 25 };
    expect(rulerLengthPx(ruler)).toBe(500);
    expect(rulerPxPerMm(ruler)).toBe(20);
  });

  it("reads typed lengths with a decimal point, a decimal comma or a unit", () => {
    expect(parseRulerLength("12.5")).toEqual({ ok: true, lengthMm: 12.5 });
    expect(parseRulerLength(" 12,5 mm ")).toEqual({ ok: true, lengthMm: 12.5 });
    expect(parseRulerLength(".5")).toEqual({ ok: true, lengthMm: 0.5 });
    expect(parseRulerLength("70MM")).toEqual({ ok: true, lengthMm: 70 });
  });

  it("explains lengths it cannot use", () => {
    expect(parseRulerLength("")).toEqual({ ok: false, message: "Type the length in millimetres, for example 12.5." });
    expect(parseRulerLength("12 cm").ok).toBe(false);
    expect(parseRulerLength("-3").ok).toBe(false);
    expect(parseRulerLength("1e3").ok).toBe(false);
    expect(parseRulerLength("0")).toEqual({ ok: false, message: "The length must be more than 0 mm." });
    expect(parseRulerLength(String(MAX_RULER_LENGTH_MM + 1))).toEqual({ ok: false, message: `The length must be at most ${MAX_RULER_LENGTH_MM} mm.` });
    expect(checkRulerLength(Number.NaN).ok).toBe(false);
    expect(checkRulerLength(Infinity).ok).toBe(false);
  });
});
