import { describe, expect, it } from "vitest";
import { undo } from "@/lib/annotate/history";
import { setViewport } from "@/lib/annotate/model";
import { activateTool } from "@/lib/annotate/tools";
import { dragSteps, drive, makeState, only, withTool } from "../helpers";

const boxState = () => withTool(makeState(), "box");

describe("Box tool", () => {
  it("draws the dragged rectangle as one region and one undo step", () => {
    const s = drive(boxState(), dragSteps(10, 10, 60, 40));
    expect(only(s.regions)).toEqual({ id: "t-1", role: "defect", defect: "scratch", shape: { kind: "rect", x: 10, y: 10, width: 50, height: 30 } });
    expect(s.draft).toBeNull();
    expect(s.history.past).toHaveLength(1);
    expect(undo(s).regions).toEqual([]);
  });

  it("shows the box while dragging and normalises a reversed drag", () => {
    const mid = drive(boxState(), [
      ["down", 60, 40],
      ["move", 30, 25],
    ]);
    expect(mid.draft).toMatchObject({ tool: "box", start: { x: 60, y: 40 }, current: { x: 30, y: 25 } });
    expect(mid.regions).toEqual([]);
    const s = drive(boxState(), dragSteps(60, 40, 10, 10));
    expect(only(s.regions).role === "defect" && only(s.regions)).toMatchObject({ shape: { x: 10, y: 10, width: 50, height: 30 } });
  });

  it("keeps a square with Shift", () => {
    const s = drive(boxState(), dragSteps(100, 100, 130, 180, 3, { shift: true }));
    expect(only(s.regions)).toMatchObject({ shape: { x: 100, y: 100, width: 80, height: 80 } });
  });

  it("adds nothing for a click or a drag shorter than the threshold on screen", () => {
    expect(drive(boxState(), [["click", 10, 10]]).regions).toEqual([]);
    // 10 image px at 25 % zoom is 2.5 stage px: still a click.
    const zoomedOut = setViewport(boxState(), { scale: 0.25, offsetX: 0, offsetY: 0 });
    expect(drive(zoomedOut, dragSteps(10, 10, 20, 10)).regions).toEqual([]);
    expect(drive(boxState(), dragSteps(10, 10, 20, 10)).regions).toHaveLength(1);
  });

  it("clamps a drag that leaves the photo", () => {
    const s = drive(boxState(), dragSteps(900, 700, 1300, 1000));
    expect(only(s.regions)).toMatchObject({ shape: { x: 900, y: 700, width: 100, height: 100 } });
  });

  it("cancels with Escape", () => {
    const s = drive(boxState(), [
      ["down", 10, 10],
      ["move", 50, 50],
      ["key", "Escape"],
      ["up", 50, 50],
    ]);
    expect(s.draft).toBeNull();
    expect(s.regions).toEqual([]);
  });

  it("cannot be picked when the part type has no defect classes", () => {
    const none = makeState({ allowedDefects: [] });
    expect(activateTool(none, "box")).toBe(none);
  });
});
