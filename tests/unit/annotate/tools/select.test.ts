import { describe, expect, it } from "vitest";
import { undo } from "@/lib/annotate/history";
import { handlesOf } from "@/lib/annotate/hit-test";
import * as model from "@/lib/annotate/model";
import type { AnnotationState, Region } from "@/lib/annotate/types";
import { dragSteps, drive, makeState } from "../helpers";

const box: Region = { id: "b1", role: "defect", defect: "dent", shape: { kind: "rect", x: 100, y: 100, width: 200, height: 100 } };
const dust: Region = { id: "d1", role: "defect", defect: "dead-pixel", shape: { kind: "spot", x: 150, y: 150, radius: 4 } };
const crack: Region = {
  id: "c1",
  role: "defect",
  defect: "crack",
  shape: {
    kind: "polygon",
    points: [
      [500, 500],
      [600, 500],
      [550, 600],
    ],
  },
};
const scratch: Region = {
  id: "s1",
  role: "defect",
  defect: "scratch",
  shape: {
    kind: "line",
    points: [
      [500, 100],
      [700, 100],
    ],
    width: 2,
  },
};
const face: Region = {
  id: "f1",
  role: "surface",
  shape: {
    kind: "polygon",
    points: [
      [0, 0],
      [1000, 0],
      [1000, 800],
      [0, 800],
    ],
  },
};
const ruler: Region = { id: "k1", role: "ruler", ruler: { a: [100, 700], b: [400, 700], lengthMm: 30 } };

const scene = (): AnnotationState => makeState({ regions: [face, box, dust, crack, scratch, ruler] });
const shape = (s: AnnotationState, id: string) => {
  const r = model.regionById(s, id);
  if (!r || r.role === "ruler") throw new Error(`no shape ${id}`);
  return r.shape;
};

describe("picking", () => {
  it("selects what is clicked and clears the selection on empty ground", () => {
    expect(drive(scene(), [["click", 250, 180]]).selectedId).toBe("b1");
    const cleared = drive(makeState({ regions: [box] }), [
      ["click", 250, 180],
      ["click", 800, 700],
    ]);
    expect(cleared.selectedId).toBeNull();
  });

  it("prefers the smaller region inside a larger one, and defects over the surface", () => {
    expect(drive(scene(), [["click", 151, 151]]).selectedId).toBe("d1");
    expect(drive(scene(), [["click", 800, 400]]).selectedId).toBe("f1");
    expect(drive(scene(), [["click", 250, 701]]).selectedId).toBe("k1");
  });

  it("hits thin lines within the on-screen tolerance at any zoom", () => {
    // 20 image px from the scratch's centre line: at 25 % that is 5 stage px (inside the 6 px tolerance).
    const zoomedOut = model.setViewport(scene(), { scale: 0.25, offsetX: 0, offsetY: 0 });
    expect(drive(zoomedOut, [["click", 600, 121]]).selectedId).toBe("s1");
    expect(drive(scene(), [["click", 600, 121]]).selectedId).toBe("f1");
  });

  it("cannot pick regions of a hidden class", () => {
    const hidden = model.toggleDefectHidden(scene(), "dead-pixel");
    expect(drive(hidden, [["click", 151, 151]]).selectedId).toBe("b1");
  });
});

describe("dragging", () => {
  const part: Region = {
    id: "f2",
    role: "surface",
    shape: {
      kind: "polygon",
      points: [
        [100, 100],
        [600, 100],
        [600, 500],
        [100, 500],
      ],
    },
  };

  it("does not move a Surface that was not selected first: the drag only selects it", () => {
    // Issue 15: a Box drag that ran with Select carried the whole Surface 250 × 170 px away.
    const s = drive(makeState({ regions: [part] }), dragSteps(300, 300, 550, 470));
    expect(s.selectedId).toBe("f2");
    expect(shape(s, "f2")).toEqual(part.shape);
    expect(s.history.past).toHaveLength(0);
    expect(s.drag).toBeNull();
  });

  it("moves a Surface once it is selected", () => {
    const s = drive(makeState({ regions: [part] }), [["click", 300, 300], ...dragSteps(300, 300, 320, 290)]);
    expect(shape(s, "f2")).toEqual({
      kind: "polygon",
      points: [
        [120, 90],
        [620, 90],
        [620, 490],
        [120, 490],
      ],
    });
    expect(s.history.past).toHaveLength(1);
  });

  it("moves a region by the drag as one undo step", () => {
    const s = drive(scene(), dragSteps(250, 180, 300, 160, 10));
    expect(shape(s, "b1")).toEqual({ kind: "rect", x: 150, y: 80, width: 200, height: 100 });
    expect(s.history.past).toHaveLength(1);
    expect(s.drag).toBeNull();
    expect(shape(undo(s), "b1")).toEqual(box.shape);
  });

  it("locks to one axis with Shift and stops at the photo's edge", () => {
    const locked = drive(scene(), dragSteps(250, 180, 300, 170, 4, { shift: true }));
    expect(shape(locked, "b1")).toMatchObject({ x: 150, y: 100 });
    const pushed = drive(scene(), dragSteps(250, 180, 2000, 180));
    expect(shape(pushed, "b1")).toMatchObject({ x: 800, y: 100 });
  });

  it("treats a press with a tiny wobble as a click (no edit)", () => {
    const s = drive(scene(), [
      ["down", 250, 180],
      ["move", 251, 181],
      ["up", 251, 181],
    ]);
    expect(s.regions).toEqual(scene().regions);
    expect(s.history.past).toHaveLength(0);
    expect(s.selectedId).toBe("b1");
  });

  it("resizes a box by a corner handle", () => {
    const s = drive(model.selectRegion(scene(), "b1"), dragSteps(300, 200, 350, 260));
    expect(shape(s, "b1")).toEqual({ kind: "rect", x: 100, y: 100, width: 250, height: 160 });
    expect(s.history.past).toHaveLength(1);
  });

  it("moves a vertex, and snaps back if the result would be degenerate", () => {
    const selected = model.selectRegion(scene(), "c1");
    const moved = drive(selected, dragSteps(550, 600, 560, 650));
    expect(shape(moved, "c1")).toEqual({
      kind: "polygon",
      points: [
        [500, 500],
        [600, 500],
        [560, 650],
      ],
    });
    const flattened = drive(selected, dragSteps(550, 600, 550, 500));
    expect(shape(flattened, "c1")).toEqual(crack.shape);
    expect(flattened.history.past).toHaveLength(0);
  });

  it("drags a spot's radius grip and a ruler's end", () => {
    const spot = drive(model.selectRegion(scene(), "d1"), dragSteps(154, 150, 160, 158));
    expect(shape(spot, "d1")).toMatchObject({ x: 150, y: 150, radius: Math.hypot(10, 8) });
    const end = drive(model.selectRegion(scene(), "k1"), dragSteps(400, 700, 500, 700));
    expect(model.regionById(end, "k1")).toMatchObject({ ruler: { a: [100, 700], b: [500, 700] } });
  });

  it("cancels a drag with Escape", () => {
    const s = drive(scene(), [
      ["down", 250, 180],
      ["move", 400, 300],
      ["key", "Escape"],
      ["up", 400, 300],
    ]);
    expect(shape(s, "b1")).toEqual(box.shape);
    expect(s.history.past).toHaveLength(0);
  });
});

describe("vertex editing", () => {
  it("deletes a vertex with Alt+click, refusing below three", () => {
    const square = model.insertRegionVertex(model.selectRegion(scene(), "c1"), "c1", 1, { x: 590, y: 570 } as never);
    const s = drive(square, [["click", 590, 570, { alt: true }]]);
    expect(shape(s, "c1")).toEqual(crack.shape);
    expect(drive(s, [["click", 500, 500, { alt: true }]]).regions).toBe(s.regions);
  });

  it("inserts a vertex where an edge is double-clicked", () => {
    const s = drive(model.selectRegion(scene(), "s1"), [["dblclick", 600, 101]]);
    expect(shape(s, "s1")).toEqual({
      kind: "line",
      points: [
        [500, 100],
        [600, 100],
        [700, 100],
      ],
      width: 2,
    });
  });

  it("lists handles for every kind of region", () => {
    expect(handlesOf(box).map((h) => h.handle)).toHaveLength(8);
    expect(handlesOf(crack).map((h) => h.point)).toEqual([
      [500, 500],
      [600, 500],
      [550, 600],
    ]);
    expect(handlesOf(dust)).toEqual([{ handle: { kind: "radius" }, point: [154, 150] }]);
    expect(handlesOf(ruler).map((h) => h.point)).toEqual([
      [100, 700],
      [400, 700],
    ]);
  });
});

describe("keys", () => {
  it("deletes, nudges and deselects", () => {
    const selected = model.selectRegion(scene(), "b1");
    expect(model.regionById(drive(selected, [["key", "Delete"]]), "b1")).toBeUndefined();
    expect(model.regionById(drive(selected, [["key", "Backspace"]]), "b1")).toBeUndefined();
    const nudged = drive(selected, [
      ["key", "ArrowRight"],
      ["key", "ArrowDown", { shift: true }],
    ]);
    expect(shape(nudged, "b1")).toMatchObject({ x: 101, y: 110 });
    expect(nudged.history.past).toHaveLength(2);
    expect(drive(selected, [["key", "Escape"]]).selectedId).toBeNull();
  });

  it("changes a selected line's width and a selected spot's radius with [ and ]", () => {
    const line = drive(model.selectRegion(scene(), "s1"), [["key", "]"]]);
    expect(shape(line, "s1")).toMatchObject({ width: 3 });
    const spot = drive(model.selectRegion(scene(), "d1"), [["key", "["]]);
    expect(shape(spot, "d1")).toMatchObject({ radius: 3.2 });
    expect(undo(spot).regions).toEqual(scene().regions);
  });
});
