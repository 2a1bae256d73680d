import { describe, expect, it } from "vitest";
import { redo, undo } from "@/lib/annotate/history";
import { setRulerLength, setViewport } from "@/lib/annotate/model";
import { draftHint } from "@/lib/annotate/tools";
import { rulerPxPerMm } from "@/lib/geometry/ruler";
import { dragSteps, drive, makeState, only, withTool } from "../helpers";

describe("Surface tool", () => {
  it("draws the part outline as a surface region without a class", () => {
    const s = drive(withTool(makeState(), "surface"), [
      ["click", 0, 0],
      ["click", 900, 0],
      ["click", 900, 700],
      ["click", 0, 700],
      ["click", 3, 2],
    ]);
    expect(only(s.regions)).toEqual({
      id: "t-1",
      role: "surface",
      shape: {
        kind: "polygon",
        points: [
          [0, 0],
          [900, 0],
          [900, 700],
          [0, 700],
        ],
      },
    });
  });

  it("works when the part type has no defect classes, and allows several surfaces", () => {
    const start = withTool(makeState({ allowedDefects: [] }), "surface");
    expect(start.activeTool).toBe("surface");
    const square = (x: number) =>
      [
        ["click", x, 0],
        ["click", x + 100, 0],
        ["click", x + 100, 100],
        ["key", "Enter"],
      ] as const;
    const s = drive(start, [...square(0), ...square(300)]);
    expect(s.regions.map((r) => r.role)).toEqual(["surface", "surface"]);
  });
});

describe("Ruler tool", () => {
  const rulerState = () => withTool(makeState(), "ruler");

  it("waits for the length after a drag, then places the ruler", () => {
    const placed = drive(rulerState(), dragSteps(100, 500, 400, 900));
    expect(placed.draft).toMatchObject({ tool: "ruler", phase: "length", a: { x: 100, y: 500 }, b: { x: 400, y: 800 } });
    expect(draftHint(placed)).toBe("Type the ruler's length in mm.");
    expect(placed.regions).toEqual([]);
    const s = setRulerLength(placed, 20);
    const region = only(s.regions);
    expect(region).toEqual({ id: "t-1", role: "ruler", ruler: { a: [100, 500], b: [400, 800], lengthMm: 20 } });
    expect(s.draft).toBeNull();
    // (100,500)→(400,800) is 300·√2 px; over 20 mm that is 15·√2 px/mm.
    expect(region.role === "ruler" && rulerPxPerMm(region.ruler)).toBeCloseTo(15 * Math.SQRT2, 12);
  });

  it("also takes two separate clicks, and ignores a second click on the first point", () => {
    const first = drive(rulerState(), [["click", 10, 10]]);
    expect(first.draft).toMatchObject({ phase: "placing", pressed: false });
    const same = drive(first, [["click", 11, 10]]);
    expect(same.draft).toMatchObject({ phase: "placing" });
    const hovering = drive(first, [["move", 200, 10]]);
    expect(hovering.draft).toMatchObject({ b: { x: 200, y: 10 } });
    expect(drive(first, [["click", 210, 10]]).draft).toMatchObject({ phase: "length", b: { x: 210, y: 10 } });
  });

  it("replaces the photo's ruler in one undo step", () => {
    const one = setRulerLength(drive(rulerState(), dragSteps(0, 0, 100, 0)), 10);
    const two = setRulerLength(drive(one, dragSteps(0, 50, 300, 50)), 30);
    expect(only(two.regions)).toMatchObject({ ruler: { b: [300, 50], lengthMm: 30 } });
    expect(only(undo(two).regions)).toMatchObject({ ruler: { b: [100, 0], lengthMm: 10 } });
    expect(only(redo(undo(two)).regions)).toMatchObject({ ruler: { lengthMm: 30 } });
  });

  it("refuses a length that is not above 0 and cancels with Escape", () => {
    const placed = drive(rulerState(), dragSteps(0, 0, 100, 0));
    expect(setRulerLength(placed, 0)).toBe(placed);
    expect(setRulerLength(placed, Number.NaN)).toBe(placed);
    expect(drive(placed, [["key", "Escape"]]).draft).toBeNull();
  });

  it("needs the drag to pass the threshold on screen", () => {
    const zoomedOut = setViewport(rulerState(), { scale: 0.1, offsetX: 0, offsetY: 0 });
    expect(drive(zoomedOut, dragSteps(0, 0, 20, 0)).draft).toMatchObject({ phase: "placing" });
  });
});
