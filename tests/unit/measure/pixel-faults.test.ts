import { describe, expect, it } from "vitest";
import type { Point, Shape } from "@/lib/geometry/shape";
import { ISO_13406_2_PER_MILLION, PIXEL_DARK, PIXEL_LIT, PIXEL_SUBPIXEL, assessPixelFaults, photoToPanelUnit, pixelFaultClass, pixelFaultLimits } from "@/lib/measure/pixel-faults";
import type { PixelFaultCounts } from "@/lib/measure/types";

const zero: PixelFaultCounts = { alwaysLit: 0, alwaysDark: 0, subPixel: 0, clustersLitOrDark: 0, clustersSubPixel: 0 };
const spot = (id: string, defect: string, x: number, y: number) => ({ id, defect, shape: { kind: "spot", x, y, radius: 2 } as Shape });

describe("ISO 13406-2 limits", () => {
  it("at exactly 1 000 000 pixels the limits are the published table", () => {
    // docs/references.md "Display pixel faults", table per 1 000 000 pixels (a).
    const limits = pixelFaultLimits(1000 * 1000);
    expect(limits.I).toEqual(zero);
    expect(limits.II).toEqual({ alwaysLit: 2, alwaysDark: 2, subPixel: 5, clustersLitOrDark: 0, clustersSubPixel: 2 });
    expect(limits.III).toEqual({ alwaysLit: 5, alwaysDark: 15, subPixel: 50, clustersLitOrDark: 0, clustersSubPixel: 5 });
    expect(limits.IV).toEqual({ alwaysLit: 50, alwaysDark: 150, subPixel: 500, clustersLitOrDark: 5, clustersSubPixel: 50 });
    expect(limits).toEqual(ISO_13406_2_PER_MILLION);
  });

  it("scales linearly and rounds down (our rule; docs/references.md marks the rule unconfirmed, b)", () => {
    // 1920 × 1080 = 2 073 600 px: 2.0736 × the table, floored.
    const limits = pixelFaultLimits(1920 * 1080);
    expect(limits.II).toEqual({ alwaysLit: 4, alwaysDark: 4, subPixel: 10, clustersLitOrDark: 0, clustersSubPixel: 4 });
    expect(limits.III).toEqual({ alwaysLit: 10, alwaysDark: 31, subPixel: 103, clustersLitOrDark: 0, clustersSubPixel: 10 });
    // 500 × 2.0736 = 1036.8: rounding to nearest would allow 1037.
    expect(limits.IV).toEqual({ alwaysLit: 103, alwaysDark: 311, subPixel: 1036, clustersLitOrDark: 10, clustersSubPixel: 103 });
    // A small panel (640 × 480 = 307 200 px) gets 0 where the table says 2: floor(0.6144).
    expect(pixelFaultLimits(640 * 480).II.alwaysLit).toBe(0);
    expect(() => pixelFaultLimits(0)).toThrow(/positive whole number/);
  });

  it("classifies against the table (1 000 000 px panel)", () => {
    const mp = 1_000_000;
    expect(pixelFaultClass(zero, mp)).toBe("I");
    expect(pixelFaultClass({ ...zero, alwaysLit: 1 }, mp)).toBe("II");
    expect(pixelFaultClass({ ...zero, alwaysLit: 3 }, mp)).toBe("III"); // II allows 2 (a)
    expect(pixelFaultClass({ ...zero, alwaysDark: 16 }, mp)).toBe("IV"); // III allows 15 (a)
    expect(pixelFaultClass({ ...zero, clustersLitOrDark: 1 }, mp)).toBe("IV"); // only IV allows clusters of type 1/2 (a)
    expect(pixelFaultClass({ ...zero, subPixel: 5, clustersSubPixel: 2 }, mp)).toBe("II");
    expect(pixelFaultClass({ ...zero, alwaysLit: 51 }, mp)).toBe("beyond");
  });
});

describe("assessPixelFaults", () => {
  const panel = { widthPx: 1000, heightPx: 1000 };

  it("counts Spots by class and finds clusters within a 5 × 5 panel-pixel block (scale mapping)", () => {
    // 3 photo px per panel px. Lit at x 100 and dark at x 112: 4 panel px apart → one block (a: cluster
    // definition in docs/references.md). The lit at x 130 is 6 panel px from x 112 → alone.
    const result = assessPixelFaults({
      panel,
      mapping: { kind: "scale", photoPxPerPanelPx: 3 },
      regions: [
        spot("a", PIXEL_LIT, 100, 100),
        spot("b", PIXEL_DARK, 112, 112),
        spot("c", PIXEL_LIT, 130, 100),
        spot("d", PIXEL_SUBPIXEL, 300, 300),
        spot("e", PIXEL_SUBPIXEL, 303, 306),
        spot("f", PIXEL_SUBPIXEL, 104, 100), // next to "a" but types 1/2 and 3 do not cluster together
        spot("g", "scratch", 100, 100),
      ],
    });
    expect(result.counts).toEqual({ alwaysLit: 2, alwaysDark: 1, subPixel: 3, clustersLitOrDark: 1, clustersSubPixel: 1 });
    expect(result.clusters).toEqual([
      { kind: "lit-or-dark", regionIds: ["a", "b"] },
      { kind: "sub-pixel", regionIds: ["d", "e"] },
    ]);
    expect(result.isoClass).toBe("IV"); // a type 1/2 cluster is only allowed in class IV (a)
    expect(result.panelPixels).toBe(1_000_000);
    expect(result.limits.II.alwaysLit).toBe(2);
    expect(result.assumptions).toEqual([]);
  });

  it("5 panel px apart is not a cluster; a chain of close faults is one cluster (single linkage)", () => {
    const apart = assessPixelFaults({ panel, mapping: { kind: "scale", photoPxPerPanelPx: 2 }, regions: [spot("a", PIXEL_DARK, 0, 0), spot("b", PIXEL_DARK, 10, 0)] });
    expect(apart.counts.clustersLitOrDark).toBe(0);
    const chain = assessPixelFaults({
      panel,
      mapping: { kind: "scale", photoPxPerPanelPx: 2 },
      regions: [spot("a", PIXEL_DARK, 0, 0), spot("b", PIXEL_DARK, 8, 0), spot("c", PIXEL_DARK, 16, 0)],
    });
    expect(chain.clusters).toEqual([{ kind: "lit-or-dark", regionIds: ["a", "b", "c"] }]);
  });

  it("maps through the panel's corners when the panel is photographed turned by 90°", () => {
    // Panel 100 × 50 px at 10 photo px per panel px; the panel's x axis runs down the photo.
    const corners: [Point, Point, Point, Point] = [
      [600, 100],
      [600, 1100],
      [100, 1100],
      [100, 100],
    ];
    const photoOf = (col: number, row: number): Point => [600 - (row + 0.5) * 10, 100 + (col + 0.5) * 10];
    const [u, v] = photoToPanelUnit(corners)(photoOf(10, 5));
    expect(u).toBeCloseTo(10.5 / 100, 12);
    expect(v).toBeCloseTo(5.5 / 50, 12);
    const result = assessPixelFaults({
      panel: { widthPx: 100, heightPx: 50 },
      mapping: { kind: "corners", corners },
      regions: [
        spot("a", PIXEL_LIT, ...photoOf(10, 5)),
        spot("b", PIXEL_LIT, ...photoOf(14, 9)), // Δ (4, 4): same 5 × 5 block
        spot("c", PIXEL_LIT, ...photoOf(40, 5)),
      ],
    });
    expect(result.clusters).toEqual([{ kind: "lit-or-dark", regionIds: ["a", "b"] }]);
    expect(result.panelPixels).toBe(5000);
  });

  it("the perspective map sends corners to the unit square and the diagonals' crossing to its centre", () => {
    // A projective map preserves incidence, so the crossing of the quad's diagonals maps to the
    // crossing of the square's diagonals, (0.5, 0.5) (a: projective geometry).
    const corners: [Point, Point, Point, Point] = [
      [120, 80],
      [980, 140],
      [900, 700],
      [60, 620],
    ];
    const toUnit = photoToPanelUnit(corners);
    const expected: Point[] = [
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 1],
    ];
    corners.forEach((corner, i) => {
      const [u, v] = toUnit(corner);
      expect(u).toBeCloseTo(expected[i][0], 9);
      expect(v).toBeCloseTo(expected[i][1], 9);
    });
    // Crossing of segments 0–2 and 1–3.
    const [[x0, y0], [x1, y1], [x2, y2], [x3, y3]] = corners;
    const t = ((x1 - x0) * (y3 - y1) - (y1 - y0) * (x3 - x1)) / ((x2 - x0) * (y3 - y1) - (y2 - y0) * (x3 - x1));
    const [u, v] = toUnit([x0 + t * (x2 - x0), y0 + t * (y2 - y0)]);
    expect(u).toBeCloseTo(0.5, 9);
    expect(v).toBeCloseTo(0.5, 9);
    expect(() =>
      photoToPanelUnit([
        [0, 0],
        [1, 1],
        [2, 2],
        [3, 3],
      ]),
    ).toThrow(/degenerate|span/);
  });

  it("states its assumptions: no mapping, non-Spot pixel regions, spots off the panel", () => {
    const unmapped = assessPixelFaults({ panel, regions: [spot("a", PIXEL_LIT, 10, 10), { id: "b", defect: PIXEL_DARK, shape: { kind: "rect", x: 0, y: 0, width: 4, height: 4 } }] });
    expect(unmapped.counts.alwaysLit).toBe(1);
    expect(unmapped.counts.alwaysDark).toBe(0);
    expect(unmapped.assumptions.join(" ")).toMatch(/not Spots/);
    expect(unmapped.assumptions.join(" ")).toMatch(/one photo pixel is taken as one panel pixel/);
    const off = assessPixelFaults({
      panel: { widthPx: 10, heightPx: 10 },
      mapping: {
        kind: "corners",
        corners: [
          [0, 0],
          [100, 0],
          [100, 100],
          [0, 100],
        ],
      },
      regions: [spot("a", PIXEL_LIT, 150, 50)],
    });
    expect(off.assumptions.join(" ")).toMatch(/outside the panel corners/);
  });

  it("rejects invalid panels and mappings", () => {
    expect(() => assessPixelFaults({ panel: { widthPx: 0, heightPx: 10 }, regions: [] })).toThrow(/Panel width/);
    expect(() => assessPixelFaults({ panel, regions: [], mapping: { kind: "scale", photoPxPerPanelPx: -1 } })).toThrow(/photoPxPerPanelPx/);
    expect(() => assessPixelFaults({ panel, regions: [spot("a", PIXEL_LIT, Number.NaN, 0)] })).toThrow(/Invalid pixel-fault input/);
  });
});
