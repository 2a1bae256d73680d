import { describe, expect, it } from "vitest";
import {
  CLASS_COLOURS,
  CLASS_FILLS,
  CLASS_STROKES,
  contrastRatio,
  haloFor,
  hexWithAlpha,
  patternKey,
  relativeLuminance,
  RULER_STYLE,
  styleOfLook,
  SURFACE_STYLE,
  ZONE_STYLE,
} from "@/lib/annotate/defect-styles";

describe("the palette", () => {
  it("uses the Okabe–Ito colours (Okabe & Ito 2008, Color Universal Design; hex values (b) from memory)", () => {
    const okabeIto = ["#E69F00", "#56B4E9", "#009E73", "#F0E442", "#0072B2", "#D55E00", "#CC79A7", "#000000"];
    expect(CLASS_COLOURS.map((c) => c.hex).filter((hex) => okabeIto.includes(hex))).toHaveLength(8);
    expect(CLASS_STROKES).toHaveLength(CLASS_COLOURS.length);
    expect(new Set(CLASS_STROKES.map((s) => s.dash.join(","))).size).toBe(CLASS_STROKES.length);
  });

  it("keeps Surface, Ruler and zones apart from every pattern a class can take", () => {
    const classPatterns = new Set(CLASS_STROKES.flatMap((_, stroke) => CLASS_FILLS.map((fill) => patternKey(styleOfLook({ colour: 0, stroke, fill })))));
    for (const style of [SURFACE_STYLE, RULER_STYLE, ZONE_STYLE]) expect(classPatterns.has(patternKey(style))).toBe(false);
    expect(new Set([SURFACE_STYLE, RULER_STYLE, ZONE_STYLE].map(patternKey)).size).toBe(3);
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
