/**
 * measurePhoto: zones from Surface-box coordinates to pixels, calibration method, mm lengths,
 * diameters and mm² areas, pixel-fault class. Source marks as in docs/references.md:
 * (a) read in a public source, (b) from memory, (c) common practice.
 */
import { describe, expect, it } from "vitest";
import * as polygonClippingModule from "polygon-clipping";
import type { MultiPolygon, Pair } from "polygon-clipping";
import type { Shape } from "@/lib/geometry/shape";
import { measurePhoto, panelFor, panelMappingFromSurface, zonesToPixels, type MeasurePhotoInput } from "@/lib/grading/measure-photo";

const polygonClipping = (polygonClippingModule as unknown as { default?: typeof polygonClippingModule }).default ?? polygonClippingModule;

/** Shoelace area of polygon-clipping's MultiPolygon output (outer ring minus holes). */
function area(shape: MultiPolygon): number {
  const ring = (r: Pair[]) => Math.abs(r.reduce((twice, [x1, y1], k) => twice + x1 * r[(k + 1) % r.length][1] - r[(k + 1) % r.length][0] * y1, 0)) / 2;
  return shape.reduce((sum, polygon) => sum + ring(polygon[0]) - polygon.slice(1).reduce((holes, h) => holes + ring(h), 0), 0);
}

const rectPolygon = (x: number, y: number, w: number, h: number): Shape => ({
  kind: "polygon",
  points: [
    [x, y],
    [x + w, y],
    [x + w, y + h],
    [x, y + h],
  ],
});

// A part outlined as a 400 × 200 px rectangle at (100, 200); a 100 px ruler over 10 mm (10 px/mm).
const surface = rectPolygon(100, 200, 400, 200);
const ruler = { a: [0, 10] as [number, number], b: [60, 90] as [number, number], lengthMm: 10 }; // 60-80-100 triangle (a: Pythagoras)
const base: MeasurePhotoInput = {
  photoId: "p1",
  viewKey: "front",
  width: 640,
  height: 480,
  defects: [],
  surfaces: [surface],
  rulers: [ruler],
  zones: [
    {
      id: "left-half",
      polygon: [
        [0, 0],
        [0.5, 0],
        [0.5, 1],
        [0, 1],
      ],
    },
  ],
  nominalSizeMm: null,
  panel: null,
};

describe("zonesToPixels", () => {
  it("maps 0..1 coordinates onto the Surface's bounding box", () => {
    // Linear map x = minX + u·w, y = minY + v·h (a: affine interpolation).
    const [zone] = zonesToPixels(
      [
        {
          id: "z",
          polygon: [
            [0, 0],
            [0.5, 0],
            [0.5, 1],
            [0.25, 0.75],
          ],
        },
      ],
      [surface],
      { width: 640, height: 480 },
    );
    expect(zone.shape.points).toEqual([
      [100, 200],
      [300, 200],
      [300, 400],
      [200, 350],
    ]);
  });

  it("uses the bounding box of several Surface outlines together", () => {
    const [zone] = zonesToPixels(
      [
        {
          id: "z",
          polygon: [
            [0, 0],
            [1, 0],
            [1, 1],
          ],
        },
      ],
      [rectPolygon(10, 20, 10, 10), rectPolygon(50, 60, 50, 40)],
      { width: 200, height: 200 },
    );
    expect(zone.shape.points).toEqual([
      [10, 20],
      [100, 20],
      [100, 100],
    ]);
  });

  it("falls back to the whole image without a Surface", () => {
    const [zone] = zonesToPixels(
      [
        {
          id: "z",
          polygon: [
            [0.5, 0.5],
            [1, 0.5],
            [1, 1],
          ],
        },
      ],
      [],
      { width: 640, height: 480 },
    );
    expect(zone.shape.points).toEqual([
      [320, 240],
      [640, 240],
      [640, 480],
    ]);
  });

  it("refuses a broken zone with a sentence naming it", () => {
    expect(() =>
      zonesToPixels(
        [
          {
            id: "lens",
            polygon: [
              [0, 0],
              [1, 0],
            ],
          },
        ],
        [surface],
        { width: 10, height: 10 },
      ),
    ).toThrow(/zone "lens" is not valid: a zone needs at least 3 points/);
    expect(() =>
      zonesToPixels(
        [
          {
            id: "lens",
            polygon: [
              [0, 0],
              [1, 0],
              [Number.NaN, 1],
            ],
          },
        ],
        [surface],
        { width: 10, height: 10 },
      ),
    ).toThrow(/zone "lens"/);
  });
});

describe("measurePhoto", () => {
  it("reports shares of the surface and of a mapped zone, and mm² areas at the ruler's scale", async () => {
    // A 50 × 50 px dent inside the left half: 2 500 px of a 400 × 200 = 80 000 px surface and of the
    // 200 × 200 = 40 000 px zone (a: rectangle area). At 10 px/mm an area scales by 1/10² (a: similar figures).
    const { measurement, notes } = await measurePhoto({ ...base, defects: [{ id: "d1", defect: "dent", shape: { kind: "rect", x: 150, y: 250, width: 50, height: 50 } }] });
    expect(measurement.calibration.method).toBe("ruler");
    expect(measurement.calibration.pxPerMm).toBeCloseTo(10, 12);
    expect(measurement.surfacePx).toBe(80_000);
    expect(measurement.surfaceMm2).toBeCloseTo(800, 9);
    expect(measurement.byDefect.dent).toMatchObject({ px: 2500, count: 1, maxLengthMm: null, totalLengthMm: null, maxDiameterMm: null });
    expect(measurement.byDefect.dent.share).toBeCloseTo(2500 / 80_000, 12);
    expect(measurement.byDefect.dent.areaMm2).toBeCloseTo(25, 9);
    expect(measurement.byZone["left-half"].zonePx).toBe(40_000);
    expect(measurement.byZone["left-half"].byDefect.dent.share).toBeCloseTo(2500 / 40_000, 12);
    expect(measurement.byZone["left-half"].byDefect.dent.areaMm2).toBeCloseTo(25, 9);
    expect(notes[0]).toMatch(/^Ruler: 100\.0 px over 10\.0 mm = 10\.00 px\/mm\.$/);
  });

  it("agrees with polygon-clipping on a slanted defect clipped to a triangular zone (1 %)", async () => {
    // Reference: polygon-clipping 0.15.7 (npm) intersection + shoelace area (docs/references.md "Areas and images").
    const zone = {
      id: "tri",
      polygon: [
        [0, 0],
        [1, 0],
        [0, 1],
      ] as [number, number][],
    };
    const defect: Shape = {
      kind: "polygon",
      points: [
        [120, 230],
        [330, 210],
        [360, 330],
        [140, 380],
      ],
    };
    const { measurement } = await measurePhoto({ ...base, zones: [zone], defects: [{ id: "d", defect: "stain", shape: defect }] });
    const zonePx: Pair[] = [
      [100, 200],
      [500, 200],
      [100, 400],
    ];
    const defectPx = defect.kind === "polygon" ? (defect.points as Pair[]) : [];
    const exactZone = area(polygonClipping.intersection([zonePx], [surface.kind === "polygon" ? (surface.points as Pair[]) : []]));
    const exactOverlap = area(polygonClipping.intersection([zonePx], [defectPx]));
    expect(Math.abs(measurement.byZone.tri.zonePx - exactZone) / exactZone).toBeLessThan(0.01);
    expect(Math.abs(measurement.byZone.tri.byDefect.stain.px - exactOverlap) / exactOverlap).toBeLessThan(0.01);
  });

  it("measures Line lengths and Spot diameters in mm and reports them per class", async () => {
    // 30-40-50 and 60-80-100 right triangles (a: Pythagoras) → 50 px and 100 px = 5 mm and 10 mm.
    const { measurement } = await measurePhoto({
      ...base,
      defects: [
        {
          id: "s1",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [150, 250],
              [180, 290],
            ],
            width: 2,
          },
        },
        {
          id: "s2",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [300, 250],
              [360, 330],
            ],
            width: 2,
          },
        },
        { id: "u1", defect: "dust", shape: { kind: "spot", x: 400, y: 300, radius: 15 } },
        { id: "u2", defect: "dust", shape: { kind: "spot", x: 450, y: 350, radius: 5 } },
      ],
    });
    expect(measurement.byDefect.scratch.maxLengthMm).toBeCloseTo(10, 9);
    expect(measurement.byDefect.scratch.totalLengthMm).toBeCloseTo(15, 9);
    expect(measurement.byDefect.scratch.count).toBe(2);
    expect(measurement.byDefect.dust.maxDiameterMm).toBeCloseTo(3, 9); // diameter = 2r (a)
    expect(measurement.byDefect.dust.maxLengthMm).toBeNull();
  });

  it("calibrates from the nominal size when there is no ruler, and says so", async () => {
    // 400 × 200 px outline of a 40 × 20 mm part → 10 px/mm on both sides.
    const { measurement, notes } = await measurePhoto({
      ...base,
      rulers: [],
      nominalSizeMm: { width: 20, height: 40 },
      defects: [{ id: "d", defect: "dent", shape: { kind: "rect", x: 110, y: 210, width: 20, height: 10 } }],
    });
    expect(measurement.calibration.method).toBe("nominal");
    expect(measurement.calibration.pxPerMm).toBeCloseTo(10, 12);
    expect(measurement.byDefect.dent.areaMm2).toBeCloseTo(2, 9);
    expect(notes[0]).toMatch(/^Nominal size:/);
  });

  it("without any calibration keeps pixels and leaves every mm value null", async () => {
    const { measurement, notes } = await measurePhoto({
      ...base,
      rulers: [],
      defects: [
        {
          id: "s",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [150, 250],
              [250, 250],
            ],
            width: 3,
          },
        },
      ],
    });
    expect(measurement.calibration).toMatchObject({ method: "none", pxPerMm: null });
    expect(measurement.surfaceMm2).toBeNull();
    expect(measurement.byDefect.scratch).toMatchObject({ areaMm2: null, maxLengthMm: null, totalLengthMm: null });
    expect(measurement.byDefect.scratch.px).toBeGreaterThan(0);
    expect(notes[0]).toMatch(/Not calibrated/);
  });

  it("notes a zone that falls outside the surface and zones placed without a Surface", async () => {
    const outside = await measurePhoto({
      ...base,
      zones: [
        {
          id: "off",
          polygon: [
            [1.2, 0],
            [1.4, 0],
            [1.4, 0.5],
          ],
        },
      ],
    });
    expect(outside.measurement.byZone.off.zonePx).toBe(0);
    expect(outside.notes.join(" ")).toMatch(/Zone "off" falls outside the Surface/);
    const noSurface = await measurePhoto({ ...base, surfaces: [] });
    expect(noSurface.measurement.surfacePx).toBe(640 * 480);
    expect(noSurface.measurement.byZone["left-half"].zonePx).toBe(320 * 480);
    expect(noSurface.notes.join(" ")).toMatch(/zones were placed on the whole image/);
  });

  it("classifies pixel faults under ISO 13406-2 on panel views", async () => {
    // Panel 1000 × 1000 = 1 000 000 px: class II allows 2 always-lit per million, class I none
    // (a: ISO 13406-2 table in docs/references.md) → 1 lit pixel is class II, 3 are class III (limit 5).
    const panel = { width: 1000, height: 1000 };
    const spots = (n: number) => Array.from({ length: n }, (_, i) => ({ id: `px${i}`, defect: "pixel-lit", shape: { kind: "spot", x: 150 + i * 100, y: 300, radius: 1 } as Shape }));
    const one = await measurePhoto({ ...base, viewKey: "screen-white", panel, defects: spots(1) });
    expect(one.measurement.pixelFaults).toMatchObject({ panelPixels: 1_000_000, isoClass: "II", counts: { alwaysLit: 1 } });
    const three = await measurePhoto({ ...base, viewKey: "screen-white", panel, defects: spots(3) });
    expect(three.measurement.pixelFaults?.isoClass).toBe("III");
    expect(three.notes.join(" ")).toMatch(/Surface is taken as the panel's active area/);
    const none = await measurePhoto({ ...base, defects: spots(1) });
    expect(none.measurement.pixelFaults).toBeNull();
  });
});

describe("panelFor and the panel mapping", () => {
  const panelResolution = { width: 1080, height: 2400 };
  it("assesses screen views and photos with marked pixel faults of display parts only", () => {
    expect(panelFor({ panelResolution, viewKey: "screen-black", defects: [] })).toEqual(panelResolution);
    expect(panelFor({ panelResolution, viewKey: "front", defects: [{ defect: "scratch" }] })).toBeNull();
    expect(panelFor({ panelResolution, viewKey: "front", defects: [{ defect: "pixel-dark" }] })).toEqual(panelResolution);
    expect(panelFor({ panelResolution: null, viewKey: "screen-white", defects: [{ defect: "pixel-dark" }] })).toBeNull();
  });

  it("matches the Surface box long side to the panel's long side", () => {
    // 540 × 1200 px box for a 1080 × 2400 panel, shot turned: 0.5 photo px per panel px on both sides.
    expect(panelMappingFromSurface([rectPolygon(0, 0, 1200, 540)], panelResolution)).toEqual({ kind: "scale", photoPxPerPanelPx: 0.5 });
    expect(panelMappingFromSurface([], panelResolution)).toBeUndefined();
  });
});
