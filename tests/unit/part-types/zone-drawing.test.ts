/**
 * Zones drawn on a photo ↔ the stored 0..1 polygons of the Surface box (docs/contracts.md; the
 * same mapping as components/annotate/zones.ts). Expected values are hand computations.
 */
import { describe, expect, it } from "vitest";
import type { PolygonShape } from "@/lib/geometry/shape";
import { drawingFromZones, surfaceBox, zonesFromDrawing, zonesToPlace } from "@/lib/part-types/zone-drawing";
import type { ZoneDefinition } from "@/lib/part-types/schemas";

// Surface box x 100–500, y 50–250 (400 × 200 px).
const surface: PolygonShape = {
  kind: "polygon",
  points: [
    [100, 50],
    [500, 50],
    [500, 250],
    [100, 250],
  ],
};
const lens: ZoneDefinition = {
  id: "lens-window",
  label: "Lens window",
  polygon: [
    [0, 0],
    [0.5, 0],
    [0.5, 1],
    [0, 1],
  ],
};
const body: ZoneDefinition = {
  id: "body",
  label: "Body",
  polygon: [
    [0, 0],
    [1, 0],
    [1, 1],
    [0, 1],
  ],
};

describe("zone drawing", () => {
  it("puts stored zones on the photo through the Surface box", () => {
    const drawing = drawingFromZones([lens], [{ id: "s", shape: surface }]);
    expect(drawing.regions).toEqual([
      {
        id: "zone-lens-window",
        defect: "lens-window",
        shape: {
          kind: "polygon",
          points: [
            [100, 50],
            [300, 50],
            [300, 250],
            [100, 250],
          ],
        },
      },
    ]);
    expect(drawingFromZones([lens], []).regions).toEqual([]); // no Surface, no box to draw them in
  });

  it("reads a Box and an Outline back as 0..1 of the box, clamped, rounded to 4 decimals", () => {
    const drawn = zonesFromDrawing(
      {
        surfaces: [{ id: "s", shape: surface }],
        regions: [
          { id: "a", defect: "lens-window", shape: { kind: "rect", x: 140, y: 70, width: 100, height: 60 } },
          {
            id: "b",
            defect: "body",
            shape: {
              kind: "polygon",
              points: [
                [90, 50],
                [333.33, 50],
                [300, 260],
              ],
            },
          },
        ],
        ruler: null,
      },
      [lens, body],
    );
    expect(drawn.problems).toEqual([]);
    // (140 − 100) / 400 = 0.1, (70 − 50) / 200 = 0.1; (240 − 100) / 400 = 0.35, (130 − 50) / 200 = 0.4.
    expect(drawn.zones[0].polygon).toEqual([
      [0.1, 0.1],
      [0.35, 0.1],
      [0.35, 0.4],
      [0.1, 0.4],
    ]);
    // 90 is left of the box → 0; 333.33 → 0.583325 → 0.5833; 260 is below → 1.
    expect(drawn.zones[1].polygon).toEqual([
      [0, 0],
      [0.5833, 0],
      [0.5, 1],
    ]);
    expect(drawn.zones[1]).toMatchObject({ id: "body", label: "Body" });
  });

  it("round-trips a stored zone exactly", () => {
    const drawing = drawingFromZones([lens, body], [{ id: "s", shape: surface }]);
    expect(zonesFromDrawing(drawing, [lens, body]).zones).toEqual([lens, body]);
  });

  it("says what it cannot take: no Surface, two shapes for one zone, a Line; a zone without a shape stays", () => {
    expect(zonesFromDrawing({ surfaces: [], regions: [], ruler: null }, [lens]).problems[0]).toMatch(/Draw the part's Surface first/);
    const drawn = zonesFromDrawing(
      {
        surfaces: [{ id: "s", shape: surface }],
        regions: [
          { id: "a", defect: "lens-window", shape: { kind: "rect", x: 140, y: 70, width: 10, height: 10 } },
          { id: "b", defect: "lens-window", shape: { kind: "rect", x: 200, y: 70, width: 10, height: 10 } },
        ],
        ruler: null,
      },
      [lens, body],
    );
    expect(drawn.problems).toEqual(["Lens window has 2 shapes; a zone is one shape: delete the extra ones."]);
    expect(drawn.unchanged).toEqual(["Body"]);
    const line = zonesFromDrawing(
      {
        surfaces: [{ id: "s", shape: surface }],
        regions: [
          {
            id: "l",
            defect: "body",
            shape: {
              kind: "line",
              points: [
                [110, 60],
                [200, 60],
              ],
              width: 4,
            },
          },
        ],
        ruler: null,
      },
      [body],
    );
    expect(line.problems[0]).toMatch(/drawn as a Line; draw a zone with Box or Outline/);
  });

  it("places the stored zones not drawn yet once a Surface exists, and none before", () => {
    const drawing = { surfaces: [{ id: "s", shape: surface }], regions: [{ id: "a", defect: "body", shape: { kind: "rect" as const, x: 110, y: 60, width: 50, height: 50 } }], ruler: null };
    // Body is drawn already; the lens window's left half of the box is x 100–300, y 50–250.
    expect(zonesToPlace(drawing, [lens, body])).toEqual([
      {
        defect: "lens-window",
        shape: {
          kind: "polygon",
          points: [
            [100, 50],
            [300, 50],
            [300, 250],
            [100, 250],
          ],
        },
      },
    ]);
    expect(zonesToPlace({ ...drawing, surfaces: [] }, [lens, body])).toEqual([]);
    expect(zonesToPlace(drawing, [{ id: "new", label: "New", polygon: [] }])).toEqual([]); // nothing stored to place
  });

  it("the box is that of all surfaces together", () => {
    expect(
      surfaceBox([
        surface,
        {
          kind: "polygon",
          points: [
            [600, 10],
            [700, 10],
            [700, 60],
          ],
        },
      ]),
    ).toEqual({ minX: 100, minY: 10, maxX: 700, maxY: 250 });
  });
});
