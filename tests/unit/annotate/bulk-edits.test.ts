/** Replacing the whole set (reload / merge) and adding accepted suggestions: each one undo step. */
import { describe, expect, it } from "vitest";
import { addNewRegions, describeAddOutcome, replaceAllRegions } from "@/lib/annotate/bulk-edits";
import { undo, redo } from "@/lib/annotate/history";
import { selectRegion } from "@/lib/annotate/model";
import type { Region } from "@/lib/annotate/types";
import { dragSteps, drive, makeState, withTool } from "./helpers";

const rect = (id: string, x: number): Region => ({ id, role: "defect", defect: "scratch", shape: { kind: "rect", x, y: 10, width: 20, height: 20 } });

describe("replacing every region", () => {
  it("is one undo step that brings the previous set back", () => {
    const drawn = drive(withTool(makeState(), "box"), dragSteps(10, 10, 60, 60));
    const mine = drawn.regions;
    const replaced = replaceAllRegions(drawn, [rect("x-1", 100), rect("x-2", 200)]);
    expect(replaced.regions.map((r) => r.id)).toEqual(["x-1", "x-2"]);
    const back = undo(replaced);
    expect(back.regions).toBe(mine);
    expect(redo(back).regions.map((r) => r.id)).toEqual(["x-1", "x-2"]);
  });

  it("leaves out repeated ids, invalid shapes and a second ruler; keeps the selection only if its region stays", () => {
    const ruler = (id: string): Region => ({ id, role: "ruler", ruler: { a: [0, 0], b: [100, 0], lengthMm: 10 } });
    const outside: Region = { id: "bad", role: "defect", defect: "scratch", shape: { kind: "rect", x: 990, y: 10, width: 50, height: 5 } };
    const start = selectRegion(replaceAllRegions(makeState(), [rect("keep", 1)]), "keep");
    const next = replaceAllRegions(start, [rect("keep", 5), rect("keep", 9), outside, ruler("r1"), ruler("r2")]);
    expect(next.regions.map((r) => r.id)).toEqual(["keep", "r1"]);
    expect(next.selectedId).toBe("keep");
    expect(replaceAllRegions(next, [rect("other", 1)]).selectedId).toBeNull();
  });

  it("drops a drawing in progress first", () => {
    const drawing = drive(withTool(makeState(), "outline"), [
      ["click", 10, 10],
      ["click", 50, 10],
    ]);
    expect(drawing.draft).not.toBeNull();
    expect(replaceAllRegions(drawing, [rect("x", 1)]).draft).toBeNull();
  });
});

describe("adding accepted suggestions", () => {
  it("adds them with fresh ids as one undo step, clamped to the photo, and shows a hidden class again", () => {
    const hidden = { ...makeState(), hiddenDefects: ["dead-pixel"] };
    const { state, ids } = addNewRegions(hidden, [
      {
        role: "surface",
        shape: {
          kind: "polygon",
          points: [
            [-5, 0],
            [500, 0],
            [500, 900],
          ],
        },
      },
      { role: "defect", defect: "dead-pixel", shape: { kind: "spot", x: 40, y: 50, radius: 1 } },
      { role: "defect", defect: "not-a-class", shape: { kind: "spot", x: 40, y: 50, radius: 1 } },
    ]);
    expect(ids).toEqual(["t-1", "t-2"]);
    expect(state.regions[0]).toEqual({
      id: "t-1",
      role: "surface",
      shape: {
        kind: "polygon",
        points: [
          [0, 0],
          [500, 0],
          [500, 800],
        ],
      },
    });
    expect(state.hiddenDefects).toEqual([]);
    expect(undo(state).regions).toEqual([]);
    expect(state.nextIdNumber).toBe(3);
  });

  it("returns the same state when nothing can be added", () => {
    const s = makeState();
    expect(addNewRegions(s, [{ role: "defect", defect: "unknown", shape: { kind: "spot", x: 1, y: 1, radius: 1 } }]).state).toBe(s);
  });

  it("counts what it left out and why: another class, an invalid shape, a repeat of a region already there", () => {
    const spot = (x: number, y: number, defect = "dead-pixel") => ({ role: "defect" as const, defect, shape: { kind: "spot" as const, x, y, radius: 1 } });
    const first = addNewRegions(makeState(), [spot(40, 50)]).state;
    const outcome = addNewRegions(first, [
      spot(40.5, 50.2),
      spot(300, 300),
      spot(300.4, 300),
      { role: "defect", defect: "dead-pixel", shape: { kind: "spot", x: 500, y: 500, radius: 0 } },
      spot(60, 60, "not-a-class"),
    ]);
    expect(outcome.ids).toHaveLength(1); // only the Spot at (300, 300); its neighbour repeats it
    expect(outcome.skipped).toEqual({ class: 1, invalid: 1, duplicate: 2, limit: 0 });
    expect(describeAddOutcome(outcome, 5)).toBe(
      "Accepted 1 of 5: 2 repeat regions of the same class already marked there; 1 is of a class this part type does not have; 1 is too small or outside the photo.",
    );
    expect(describeAddOutcome({ ids: ["a", "b"], skipped: { class: 0, invalid: 0, duplicate: 0, limit: 0 } }, 2)).toBe("Accepted 2 of 2.");
  });
});
