import { describe, expect, it } from "vitest";
import { DEFAULT_LINE_WIDTH, LINE_WIDTH_STEPS, stepAlongLadder } from "@/lib/annotate/constants";
import { draftHint } from "@/lib/annotate/tools";
import type { LineShape } from "@/lib/geometry/shape";
import { dragSteps, drive, makeState, only, withTool } from "../helpers";

const lineState = () => withTool(makeState(), "line");

function lineOf(state: ReturnType<typeof makeState>): LineShape {
  const region = only(state.regions);
  if (region.role === "ruler" || region.shape.kind !== "line") throw new Error("expected a line");
  return region.shape;
}

describe("Line tool", () => {
  it("adds clicked vertices and finishes on a double-click", () => {
    const s = drive(lineState(), [
      ["click", 10, 10],
      ["click", 50, 30],
      ["dblclick", 90, 10],
    ]);
    expect(lineOf(s)).toEqual({
      kind: "line",
      points: [
        [10, 10],
        [50, 30],
        [90, 10],
      ],
      width: DEFAULT_LINE_WIDTH,
    });
    expect(s.history.past).toHaveLength(1);
  });

  it("finishes with Enter once it has two different points", () => {
    const one = drive(lineState(), [
      ["click", 10, 10],
      ["key", "Enter"],
    ]);
    expect(one.regions).toEqual([]);
    expect(draftHint(one)).toBe("a line needs at least 2 different points.");
    expect(
      lineOf(
        drive(one, [
          ["click", 40, 10],
          ["key", "Enter"],
        ]),
      ).points,
    ).toEqual([
      [10, 10],
      [40, 10],
    ]);
  });

  it("steps the width with [ and ] along the ladder, during and between drawings", () => {
    expect(stepAlongLadder(4, 1)).toBe(6);
    expect(stepAlongLadder(5, -1)).toBe(4);
    expect(stepAlongLadder(LINE_WIDTH_STEPS[0], -1)).toBe(1);
    const s = drive(lineState(), [
      ["click", 10, 10],
      ["key", "]"],
      ["key", "]"],
      ["click", 80, 10],
      ["key", "Enter"],
    ]);
    expect(lineOf(s).width).toBe(8);
    expect(s.lineWidth).toBe(8);
    expect(drive(s, [["key", "["]]).lineWidth).toBe(6);
    // Width keys are settings, not edits.
    expect(s.history.past).toHaveLength(1);
  });

  it("finishes a freehand stroke on release", () => {
    const s = drive(lineState(), dragSteps(100, 100, 300, 100, 40));
    // A straight stroke thins down to its two ends.
    expect(lineOf(s).points).toEqual([
      [100, 100],
      [300, 100],
    ]);
  });

  it("turns a there-and-back click sequence into a single segment (no self-closing line)", () => {
    const s = drive(lineState(), [
      ["click", 10, 10],
      ["click", 60, 60],
      ["click", 10, 10],
      ["key", "Enter"],
    ]);
    expect(lineOf(s).points).toEqual([
      [10, 10],
      [60, 60],
    ]);
  });

  it("keeps a closed loop over three points", () => {
    const s = drive(lineState(), [
      ["click", 10, 10],
      ["click", 60, 10],
      ["click", 30, 50],
      ["click", 10, 10],
      ["key", "Enter"],
    ]);
    expect(lineOf(s).points).toEqual([
      [10, 10],
      [60, 10],
      [30, 50],
      [10, 10],
    ]);
  });

  it("cancels with Escape", () => {
    expect(
      drive(lineState(), [
        ["click", 10, 10],
        ["click", 20, 20],
        ["key", "Escape"],
      ]).draft,
    ).toBeNull();
  });
});
