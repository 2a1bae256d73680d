import { describe, expect, it } from "vitest";
import { MAX_POINTS_PER_SHAPE, MAX_REGIONS_PER_PHOTO, MAX_TOTAL_POINTS_PER_PHOTO } from "@/lib/geometry/limits";
import type { Point } from "@/lib/geometry/shape";
import { MAX_MESSAGES, parseRegionSet, regionSetSchema, type RegionSetContext } from "@/lib/geometry/validate";

const context: RegionSetContext = { width: 400, height: 300, allowedDefects: ["scratch", "crack", "dent"] };

const goodSet = {
  regions: [
    {
      id: "r1",
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [10, 10],
          [60, 40],
          [90, 35],
        ],
        width: 3,
      },
    },
    { id: "r2", defect: "dent", shape: { kind: "rect", x: 0, y: 0, width: 400, height: 300 } },
    {
      id: "r3",
      defect: "crack",
      shape: {
        kind: "polygon",
        points: [
          [100, 100],
          [150, 100],
          [120, 160],
        ],
      },
    },
    { id: "r4", defect: "dent", shape: { kind: "spot", x: 400, y: 300, radius: 12 } },
  ],
  surfaces: [
    {
      id: "s1",
      shape: {
        kind: "polygon",
        points: [
          [5, 5],
          [395, 5],
          [395, 295],
          [5, 295],
        ],
      },
    },
  ],
  ruler: { id: "k1", a: [10, 290], b: [210, 290], lengthMm: 20 },
};

/** goodSet with region 1's shape replaced. */
function withShape(shape: unknown, defect = "scratch") {
  return { ...goodSet, regions: [{ id: "x1", defect, shape }] };
}

function messages(input: unknown): string[] {
  const result = parseRegionSet(input, context);
  if (result.ok) throw new Error("expected the set to be rejected");
  return result.messages;
}

describe("a valid region set", () => {
  it("parses, with surfaces and ruler optional", () => {
    const result = parseRegionSet(goodSet, context);
    expect(result.ok).toBe(true);
    expect(parseRegionSet({ regions: [] }, context)).toEqual({ ok: true, value: { regions: [], surfaces: [], ruler: null } });
  });

  it("accepts polygons that repeat points (the ring closes itself) and closed loops of 3+ points", () => {
    expect(
      parseRegionSet(
        withShape({
          kind: "polygon",
          points: [
            [1, 1],
            [50, 1],
            [50, 1],
            [1, 40],
            [1, 1],
          ],
        }),
        context,
      ).ok,
    ).toBe(true);
    expect(
      parseRegionSet(
        withShape({
          kind: "line",
          points: [
            [1, 1],
            [50, 1],
            [1, 40],
            [1, 1],
          ],
          width: 2,
        }),
        context,
      ).ok,
    ).toBe(true);
  });

  it("refuses to build a schema for a photo without a size", () => {
    expect(() => regionSetSchema({ ...context, width: 0 })).toThrow(RangeError);
    expect(() => regionSetSchema({ ...context, height: Number.NaN })).toThrow(RangeError);
  });
});

describe("numbers that are not finite", () => {
  it("rejects NaN and ±Infinity given directly", () => {
    expect(messages(withShape({ kind: "spot", x: Number.NaN, y: 5, radius: 2 }))).toEqual(["Region 1 (Spot): x must be a finite number."]);
    expect(messages(withShape({ kind: "rect", x: 1, y: 1, width: Infinity, height: 2 }))).toEqual(["Region 1 (Box): the width must be a finite number."]);
    expect(
      messages(
        withShape({
          kind: "polygon",
          points: [
            [1, 1],
            [2, -Infinity],
            [3, 1],
          ],
        }),
      ),
    ).toEqual(["Region 1 (Outline): y of point 2 must be a finite number."]);
  });

  it("rejects 1e309, which JSON.parse turns into Infinity", () => {
    const body = '{"regions":[{"id":"a","defect":"crack","shape":{"kind":"line","points":[[1,1],[1e309,2]],"width":2}}]}';
    expect(JSON.parse(body).regions[0].shape.points[1][0]).toBe(Infinity);
    expect(messages(JSON.parse(body))).toEqual(["Region 1 (Line): x of point 2 must be a finite number."]);
  });

  it("rejects numbers sent as text", () => {
    expect(messages(withShape({ kind: "spot", x: "5", y: 5, radius: 2 }))).toEqual(["Region 1 (Spot): x must be a finite number."]);
  });
});

describe("degenerate shapes", () => {
  it("names the region and what is wrong", () => {
    const set = {
      regions: [
        goodSet.regions[0],
        goodSet.regions[1],
        {
          id: "bad",
          defect: "crack",
          shape: {
            kind: "polygon",
            points: [
              [0, 0],
              [10, 10],
              [20, 20],
            ],
          },
        },
      ],
    };
    expect(messages(set)).toEqual(["Region 3 (Outline): a polygon needs at least 3 points that are not on one line."]);
    expect(
      messages(
        withShape({
          kind: "polygon",
          points: [
            [0, 0],
            [5, 5],
          ],
        }),
      ),
    ).toEqual(["Region 1 (Outline): a polygon needs at least 3 points that are not on one line."]);
    expect(
      messages(
        withShape({
          kind: "polygon",
          points: [
            [0, 0],
            [20, 20],
            [20, 0],
            [0, 20],
          ],
        }),
      )[0],
    ).toMatch(/^Region 1 \(Outline\): the polygon encloses no area/);
    expect(messages(withShape({ kind: "rect", x: 1, y: 1, width: 0, height: 2 }))).toEqual(["Region 1 (Box): a box needs a width and a height above 0."]);
    expect(messages(withShape({ kind: "spot", x: 1, y: 1, radius: -2 }))).toEqual(["Region 1 (Spot): a spot needs a radius above 0."]);
    expect(
      messages(
        withShape({
          kind: "line",
          points: [
            [1, 1],
            [9, 9],
          ],
          width: 0,
        }),
      ),
    ).toEqual(["Region 1 (Line): a line needs a width above 0."]);
    expect(
      messages(
        withShape({
          kind: "line",
          points: [
            [3, 3],
            [3, 3],
            [3, 3],
          ],
          width: 2,
        }),
      ),
    ).toEqual(["Region 1 (Line): a line needs at least 2 different points."]);
  });

  it("rejects self-closing lines that only retrace two points", () => {
    const expected = "Region 1 (Line): the line only runs back and forth between 2 points (it closes on itself); draw it once from one end to the other.";
    expect(
      messages(
        withShape({
          kind: "line",
          points: [
            [10, 10],
            [50, 50],
            [10, 10],
          ],
          width: 2,
        }),
      ),
    ).toEqual([expected]);
    expect(
      messages(
        withShape({
          kind: "line",
          points: [
            [10, 10],
            [50, 50],
            [10, 10],
            [50, 50],
          ],
          width: 2,
        }),
      ),
    ).toEqual([expected]);
  });
});

describe("coordinates outside the image", () => {
  it("rejects any defining point past [0, width] × [0, height]", () => {
    expect(
      messages(
        withShape({
          kind: "polygon",
          points: [
            [0, 0],
            [401, 0],
            [0, 300],
          ],
        }),
      ),
    ).toEqual(["Region 1 (Outline): point 2 (401, 0) lies outside the 400 × 300 px photo."]);
    expect(messages(withShape({ kind: "rect", x: -1, y: 0, width: 5, height: 5 }))).toEqual(["Region 1 (Box): the box reaches outside the 400 × 300 px photo."]);
    expect(messages(withShape({ kind: "spot", x: 200, y: 300.01, radius: 5 }))).toEqual(["Region 1 (Spot): the spot's centre (200, 300.01) lies outside the 400 × 300 px photo."]);
    expect(
      messages({
        regions: [],
        surfaces: [
          {
            id: "s",
            shape: {
              kind: "polygon",
              points: [
                [0, 0],
                [10, 0],
                [10, -5],
              ],
            },
          },
        ],
      }),
    ).toEqual(["Surface 1: point 3 (10, -5) lies outside the 400 × 300 px photo."]);
    expect(messages({ regions: [], ruler: { id: "k", a: [0, 0], b: [500, 0], lengthMm: 10 } })).toEqual(["Ruler: end b lies outside the 400 × 300 px photo."]);
  });
});

describe("round-off at the edge", () => {
  it("absorbs floating-point round-off (1e-6 px) but nothing a person could draw", () => {
    expect(parseRegionSet(withShape({ kind: "rect", x: 0.1 + 0.2, y: 0, width: 400 - 0.3 + 1e-9, height: 300 }), context).ok).toBe(true);
    expect(parseRegionSet(withShape({ kind: "spot", x: 400.0000001, y: -0.0000001, radius: 2 }), context).ok).toBe(true);
    expect(messages(withShape({ kind: "spot", x: 400.00001, y: 0, radius: 2 }))[0]).toMatch(/outside/);
  });
});

describe("sizes", () => {
  it("rejects a shape with more than the point limit", () => {
    const points: Point[] = Array.from({ length: MAX_POINTS_PER_SHAPE + 1 }, (_, i) => [i % 400, Math.floor(i / 400)]);
    expect(messages(withShape({ kind: "polygon", points }))).toEqual([`Region 1 (Outline): the points may hold at most ${MAX_POINTS_PER_SHAPE} points.`]);
  });

  it("rejects a huge array quickly, before looking at its elements", () => {
    const points = new Array(2_000_000).fill([1, 1]);
    const started = performance.now();
    expect(messages(withShape({ kind: "line", points, width: 1 }))).toHaveLength(1);
    // Not a speed target: a generous bound that only fails if every element were parsed.
    expect(performance.now() - started).toBeLessThan(2_000);
  });

  it("rejects too many regions per photo", () => {
    const region = goodSet.regions[1];
    const regions = Array.from({ length: MAX_REGIONS_PER_PHOTO + 1 }, (_, i) => ({ ...region, id: `r${i}` }));
    expect(messages({ regions })).toEqual([`Regions: may hold at most ${MAX_REGIONS_PER_PHOTO} regions per photo.`]);
  });

  it("rejects a photo whose regions hold too many points in all", () => {
    const ring: Point[] = Array.from({ length: 5_000 }, (_, i) => [200 + 100 * Math.cos(i / 796), 150 + 100 * Math.sin(i / 796)]);
    const count = MAX_TOTAL_POINTS_PER_PHOTO / 5_000 + 1;
    const regions = Array.from({ length: count }, (_, i) => ({ id: `r${i}`, defect: "dent", shape: { kind: "polygon", points: ring } }));
    expect(messages({ regions })).toEqual([`Region set: the photo's regions hold ${count * 5_000} points in all; at most ${MAX_TOTAL_POINTS_PER_PHOTO} are allowed (simplify the longest outlines).`]);
  });

  it("caps the number of messages", () => {
    const regions = Array.from({ length: 50 }, (_, i) => ({ id: `r${i}`, defect: "rust", shape: goodSet.regions[1].shape }));
    const list = messages({ regions });
    expect(list).toHaveLength(MAX_MESSAGES + 1);
    expect(list[MAX_MESSAGES]).toBe(`…and ${50 - MAX_MESSAGES} more problems.`);
  });
});

describe("classes, ids, kinds and fields", () => {
  it("rejects an unknown defect class and lists the allowed ones", () => {
    expect(messages({ regions: [{ ...goodSet.regions[1], defect: "rust" }] })).toEqual(["Region 1 (Box): the defect class “rust” is not allowed for this part type (allowed: scratch, crack, dent)."]);
  });

  it("rejects duplicate, empty, long and odd ids", () => {
    const dup = { regions: [goodSet.regions[0], { ...goodSet.regions[1], id: "r1" }], surfaces: [{ ...goodSet.surfaces[0], id: "r1" }] };
    expect(messages(dup)).toEqual(["Region 2 (Box): the id “r1” is already used by region 1.", "Surface 1: the id “r1” is already used by region 1."]);
    expect(messages({ regions: [{ ...goodSet.regions[1], id: "" }] })).toEqual(["Region 1 (Box): the id must not be empty."]);
    expect(messages({ regions: [{ ...goodSet.regions[1], id: "x".repeat(65) }] })).toEqual(["Region 1 (Box): the id must be at most 64 characters."]);
    expect(messages({ regions: [{ ...goodSet.regions[1], id: "a b" }] })).toEqual(["Region 1 (Box): the id may only use letters, digits, - and _."]);
  });

  it("rejects unknown shape kinds, unknown fields and wrong containers", () => {
    expect(messages(withShape({ kind: "triangle", points: [] }))).toEqual(['Region 1: kind must be "rect", "polygon", "line" or "spot".']);
    expect(messages(withShape({ kind: "constructor" }))).toEqual(['Region 1: kind must be "rect", "polygon", "line" or "spot".']);
    expect(messages(withShape({ kind: "spot", x: 1, y: 1, radius: 2, colour: "red" }))).toEqual(["Region 1 (Spot): the shape has unknown field(s) colour."]);
    expect(
      messages(
        withShape({
          kind: "line",
          points: [
            [1, 1, 1],
            [2, 2],
          ],
          width: 1,
        }),
      ),
    ).toEqual(["Region 1 (Line): point 1 must be a pair [x, y]."]);
    expect(messages({ regions: "none" })).toEqual(["Regions: must be a list."]);
    expect(messages(null)).toEqual(["Region set: must be an object with regions, surfaces and ruler."]);
    expect(messages({ regions: [], extra: 1 })).toEqual(["Region set: has unknown field(s) extra."]);
    expect(messages({ regions: [], surfaces: [{ id: "s", shape: goodSet.regions[1].shape }] })[0]).toMatch(/^Surface 1: /);
  });

  it("checks the ruler's ends and length", () => {
    expect(messages({ regions: [], ruler: { id: "k", a: [5, 5], b: [5, 5], lengthMm: 10 } })).toEqual(["Ruler: a ruler needs two different end points."]);
    expect(messages({ regions: [], ruler: { id: "k", a: [5, 5], b: [9, 5], lengthMm: 0 } })).toEqual(["Ruler: the length must be more than 0 mm."]);
    expect(messages({ regions: [], ruler: { id: "k", a: [5, 5], b: [9, 5], lengthMm: 1e6 } })).toEqual(["Ruler: the length must be at most 10000 mm."]);
    expect(messages({ regions: [], ruler: { id: "k", a: [5, Number.NaN], b: [9, 5], lengthMm: 3 } })).toEqual(["Ruler: y of end a must be a finite number."]);
  });
});
