import { describe, expect, it } from "vitest";
import {
  CLASS_COLOURS,
  CLASS_STROKES,
  contrastRatio,
  defectStyleAt,
  defectStyleMap,
  haloFor,
  hexWithAlpha,
  patternKey,
  relativeLuminance,
  RULER_STYLE,
  SURFACE_STYLE,
  ZONE_STYLE,
} from "@/components/annotate/defect-styles";

const FIRST_NINE = Array.from({ length: 9 }, (_, i) => defectStyleAt(i));

describe("class styles are told apart without colour", () => {
  it("gives the first 9 classes 9 different patterns (dash + fill)", () => {
    expect(new Set(FIRST_NINE.map(patternKey)).size).toBe(9);
  });

  it("gives the first 9 classes 9 different dash arrays, so Line regions differ too", () => {
    expect(new Set(FIRST_NINE.map((s) => s.stroke.dash.join(","))).size).toBe(9);
    expect(new Set(FIRST_NINE.map((s) => s.stroke.name)).size).toBe(9);
  });

  it("gives the first 9 classes 9 different colours", () => {
    expect(new Set(FIRST_NINE.map((s) => s.colour.toLowerCase())).size).toBe(9);
  });

  it("keeps classes 10–18 apart from classes 1–9 that share their colour", () => {
    for (let i = 9; i < 18; i++) {
      const repeat = defectStyleAt(i);
      const sameColour = defectStyleAt(i % 9);
      expect(repeat.colour).toBe(sameColour.colour);
      expect(patternKey(repeat)).not.toBe(patternKey(sameColour));
    }
    const first18 = Array.from({ length: 18 }, (_, i) => defectStyleAt(i));
    expect(new Set(first18.map((s) => `${s.colour}|${patternKey(s)}`)).size).toBe(18);
  });

  it("keeps Surface, Ruler and zones apart from every class pattern", () => {
    const classPatterns = new Set(FIRST_NINE.map(patternKey));
    for (const style of [SURFACE_STYLE, RULER_STYLE, ZONE_STYLE]) expect(classPatterns.has(patternKey(style))).toBe(false);
    expect(new Set([SURFACE_STYLE, RULER_STYLE, ZONE_STYLE].map(patternKey)).size).toBe(3);
  });

  it("uses the Okabe–Ito colours (Okabe & Ito 2008, Color Universal Design; hex values (b) from memory)", () => {
    const okabeIto = ["#E69F00", "#56B4E9", "#009E73", "#F0E442", "#0072B2", "#D55E00", "#CC79A7", "#000000"];
    expect(CLASS_COLOURS.map((c) => c.hex).filter((hex) => okabeIto.includes(hex))).toHaveLength(8);
    expect(CLASS_STROKES).toHaveLength(CLASS_COLOURS.length);
  });

  it("maps class keys to styles in list order", () => {
    const map = defectStyleMap(["scratch", "crack"]);
    expect(map.get("scratch")).toEqual(defectStyleAt(0));
    expect(map.get("crack")).toEqual(defectStyleAt(1));
    expect(() => defectStyleAt(-1)).toThrow(RangeError);
  });
});

describe("contrast (WCAG 2.x relative luminance and contrast ratio)", () => {
  // (a) WCAG 2.1, definitions of "relative luminance" and "contrast ratio": white 1, black 0, 21:1.
  it("matches the definition's end points", () => {
    expect(relativeLuminance("#FFFFFF")).toBeCloseTo(1, 10);
    expect(relativeLuminance("#000")).toBe(0);
    expect(contrastRatio("#000000", "#FFFFFF")).toBeCloseTo(21, 10);
    expect(contrastRatio("#FFFFFF", "#000000")).toBeCloseTo(21, 10);
  });

  // (a) A widely published worked figure: #777777 on white is 4.48:1, just under the AA 4.5:1.
  it("gives #777777 on white 4.48:1", () => {
    expect(contrastRatio("#777777", "#FFFFFF")).toBeCloseTo(4.48, 2);
  });

  it("puts a dark halo under light colours and a light halo under dark ones", () => {
    expect(haloFor("#F0E442")).toMatch(/^rgba\(0, 0, 0/); // yellow
    expect(haloFor("#FFFFFF")).toMatch(/^rgba\(0, 0, 0/);
    expect(haloFor("#000000")).toMatch(/^rgba\(255, 255, 255/);
    expect(haloFor("#0072B2")).toMatch(/^rgba\(255, 255, 255/); // blue
  });

  it("refuses what is not a hex colour", () => {
    expect(() => relativeLuminance("red")).toThrow(RangeError);
    expect(() => hexWithAlpha("#FFF", 0.5)).toThrow(RangeError);
  });

  it("writes a hex colour with an alpha as rgba()", () => {
    expect(hexWithAlpha("#D55E00", 0.18)).toBe("rgba(213, 94, 0, 0.18)");
  });
});
