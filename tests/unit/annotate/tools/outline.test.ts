import { describe, expect, it } from "vitest";
import { CLOSE_TOLERANCE_PX, SIMPLIFY_TOLERANCE_PX } from "@/lib/annotate/constants";
import { setViewport } from "@/lib/annotate/model";
import { draftHint } from "@/lib/annotate/tools";
import { distanceToPolyline } from "@/lib/geometry/distance";
import { MAX_POINTS_PER_SHAPE } from "@/lib/geometry/limits";
import type { Point } from "@/lib/geometry/shape";
import { drive, makeState, only, withTool } from "../helpers";

const outlineState = () => withTool(makeState(), "outline");
const triangleClicks = [
  ["click", 100, 100],
  ["click", 200, 100],
  ["click", 150, 180],
] as const;

function polygonPoints(state: ReturnType<typeof makeState>): Point[] {
  const region = only(state.regions);
  if (region.role === "ruler" || region.shape.kind !== "polygon") throw new Error("expected a polygon");
  return region.shape.points;
}

describe("Outline tool", () => {
  it("closes on a click near the first vertex", () => {
    const s = drive(outlineState(), [...triangleClicks, ["click", 104, 103]]);
    expect(only(s.regions)).toEqual({
      id: "t-1",
      role: "defect",
      defect: "scratch",
      shape: {
        kind: "polygon",
        points: [
          [100, 100],
          [200, 100],
          [150, 180],
        ],
      },
    });
    expect(s.draft).toBeNull();
    expect(s.history.past).toHaveLength(1);
  });

  it("measures the closing distance in stage pixels", () => {
    // At 400 % zoom, 5 image px is 20 stage px (too far to close) and 2 image px is 8 (close enough).
    const zoomed = setViewport(outlineState(), { scale: 4, offsetX: 0, offsetY: 0 });
    expect(5 * 4).toBeGreaterThan(CLOSE_TOLERANCE_PX);
    const far = drive(zoomed, [...triangleClicks, ["click", 105, 100]]);
    expect(far.regions).toEqual([]);
    expect(far.draft).toMatchObject({ points: [{ x: 100 }, { x: 200 }, { x: 150 }, { x: 105 }] });
    expect(drive(zoomed, [...triangleClicks, ["click", 102, 100]]).regions).toHaveLength(1);
  });

  it("closes with Enter or a double-click", () => {
    expect(polygonPoints(drive(outlineState(), [...triangleClicks, ["key", "Enter"]]))).toEqual([
      [100, 100],
      [200, 100],
      [150, 180],
    ]);
    const dbl = drive(outlineState(), [
      ["click", 100, 100],
      ["click", 200, 100],
      ["dblclick", 150, 180],
    ]);
    expect(polygonPoints(dbl)).toEqual([
      [100, 100],
      [200, 100],
      [150, 180],
    ]);
  });

  it("will not close fewer than 3 points, or points on one line, and says why", () => {
    const two = drive(outlineState(), [
      ["click", 100, 100],
      ["click", 200, 100],
      ["key", "Enter"],
    ]);
    expect(two.regions).toEqual([]);
    expect(two.draft).not.toBeNull();
    expect(draftHint(two)).toBe("a polygon needs at least 3 points that are not on one line.");
    const straight = drive(outlineState(), [
      ["click", 100, 100],
      ["click", 200, 100],
      ["click", 300, 100],
      ["key", "Enter"],
    ]);
    expect(straight.regions).toEqual([]);
    expect(draftHint(drive(outlineState(), triangleClicks))).toBeNull();
  });

  it("removes the last vertex with Backspace or Ctrl/Cmd+Z and cancels with Escape", () => {
    const s = drive(outlineState(), [...triangleClicks, ["key", "Backspace"]]);
    expect(s.draft).toMatchObject({ points: [{ x: 100 }, { x: 200 }] });
    const z = drive(outlineState(), [...triangleClicks, ["key", "z", { mod: true }]]);
    expect(z.draft).toMatchObject({ points: [{ x: 100 }, { x: 200 }] });
    expect(
      drive(outlineState(), [
        ["click", 1, 1],
        ["key", "Backspace"],
      ]).draft,
    ).toBeNull();
    expect(drive(outlineState(), [...triangleClicks, ["key", "Escape"]]).draft).toBeNull();
  });

  it("draws a freehand lasso in one press-drag-release and thins it", () => {
    const moves: ["move", number, number][] = [];
    for (let i = 1; i <= 360; i++) moves.push(["move", 300 + 100 * Math.cos((i * Math.PI) / 180), 300 + 100 * Math.sin((i * Math.PI) / 180)]);
    const s = drive(outlineState(), [["down", 400, 300], ...moves, ["up", 400, 300]]);
    const points = polygonPoints(s);
    expect(points.length).toBeGreaterThan(10);
    expect(points.length).toBeLessThan(200);
    // Every pointer sample stays within the thinning tolerance of the stored outline.
    const worst = Math.max(...moves.map(([, x, y]) => distanceToPolyline([x, y], points, true)));
    expect(worst).toBeLessThanOrEqual(SIMPLIFY_TOLERANCE_PX + 1e-9);
  });

  it("caps a very long freehand outline at the point limit", () => {
    const zoomed = setViewport(outlineState(), { scale: 32, offsetX: 0, offsetY: 0 });
    const moves: ["move", number, number][] = [];
    // A jagged 6 000-sample stroke that thinning alone cannot bring under the limit.
    for (let i = 1; i <= 6_000; i++) moves.push(["move", 100 + (i % 2) * 3 + i * 0.05, 100 + 200 * Math.sin(i / 1900)]);
    const pressed = drive(zoomed, [["down", 100, 100], ...moves]);
    expect(pressed.draft?.tool === "outline" && pressed.draft.points.length).toBeGreaterThan(MAX_POINTS_PER_SHAPE);
    const s = drive(pressed, [["up", 100 + 6_000 * 0.05, 100]]);
    expect(polygonPoints(s).length).toBeLessThanOrEqual(MAX_POINTS_PER_SHAPE);
    expect(polygonPoints(s).length).toBeGreaterThan(MAX_POINTS_PER_SHAPE / 4);
  });

  it("clamps vertices clicked beside the photo onto its edge", () => {
    const s = drive(outlineState(), [
      ["click", -50, 100],
      ["click", 200, -20],
      ["click", 200, 300],
      ["key", "Enter"],
    ]);
    expect(polygonPoints(s)).toEqual([
      [0, 100],
      [200, 0],
      [200, 300],
    ]);
  });
});
