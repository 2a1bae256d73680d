import { describe, expect, it } from "vitest";
import { applyEdit, beginBatch, canRedo, canUndo, cancelBatch, commitBatch, redo, undo } from "@/lib/annotate/history";
import type { Region } from "@/lib/annotate/types";
import { makeState } from "./helpers";

const spot = (id: string, x: number): Region => ({ id, role: "defect", defect: "dent", shape: { kind: "spot", x, y: 10, radius: 2 } });

describe("undo and redo", () => {
  it("steps back and forth through edits, restoring the selection of the time", () => {
    const s0 = makeState();
    const s1 = applyEdit(s0, [spot("a", 1)], "a");
    const s2 = applyEdit(s1, [spot("a", 1), spot("b", 2)], "b");
    expect(s2.history.past).toHaveLength(2);
    const u1 = undo(s2);
    expect(u1.regions).toBe(s1.regions);
    expect(u1.selectedId).toBe("a");
    const u2 = undo(u1);
    expect(u2.regions).toEqual([]);
    expect(canUndo(u2)).toBe(false);
    expect(undo(u2)).toBe(u2);
    const r1 = redo(u2);
    expect(r1.regions).toBe(s1.regions);
    expect(redo(redo(r1)).regions).toBe(s2.regions);
  });

  it("drops the redo stack on a new edit", () => {
    const s = undo(applyEdit(applyEdit(makeState(), [spot("a", 1)]), [spot("a", 5)]));
    expect(canRedo(s)).toBe(true);
    const branched = applyEdit(s, [spot("a", 9)]);
    expect(canRedo(branched)).toBe(false);
    expect(redo(branched)).toBe(branched);
  });

  it("records nothing for a no-op edit", () => {
    const s = makeState();
    expect(applyEdit(s, s.regions)).toBe(s);
  });

  it("keeps at most `limit` steps", () => {
    let s = makeState({ historyLimit: 3 });
    for (let i = 1; i <= 5; i++) s = applyEdit(s, [spot("a", i)]);
    expect(s.history.past).toHaveLength(3);
    s = undo(undo(undo(s)));
    expect(s.regions).toEqual([spot("a", 2)]);
    expect(canUndo(s)).toBe(false);
  });

  it("drops an unfinished drawing before undoing edits", () => {
    const s = applyEdit(makeState(), [spot("a", 1)]);
    const drafting = { ...s, draft: { tool: "box" as const, start: { x: 0, y: 0 } as never, current: { x: 1, y: 1 } as never } };
    const undone = undo(drafting);
    expect(undone.draft).toBeNull();
    expect(undone.regions).toBe(s.regions);
    expect(redo(drafting)).toBe(drafting);
  });
});

describe("batches (one drag = one step)", () => {
  it("coalesces many changes into one undo step", () => {
    let s = beginBatch(applyEdit(makeState(), [spot("a", 0)]));
    for (let x = 1; x <= 20; x++) s = applyEdit(s, [spot("a", x)]);
    expect(canRedo(s)).toBe(false);
    s = commitBatch(s);
    expect(s.history.past).toHaveLength(2);
    expect(undo(s).regions).toEqual([spot("a", 0)]);
  });

  it("records nothing when the batch changed nothing", () => {
    const s = applyEdit(makeState(), [spot("a", 0)]);
    const committed = commitBatch(beginBatch(s));
    expect(committed.history.past).toHaveLength(1);
    expect(committed.history.pending).toBeNull();
  });

  it("records nothing when a drag ends on the regions it started with", () => {
    const s = applyEdit(makeState(), [spot("a", 0)]);
    const original = s.regions[0];
    const back = commitBatch(applyEdit(applyEdit(beginBatch(s), [spot("a", 9)]), [original]));
    expect(back.history.past).toHaveLength(1);
  });

  it("can be cancelled, and undo during a batch cancels it", () => {
    const s = applyEdit(makeState(), [spot("a", 0)]);
    const moved = applyEdit(beginBatch(s), [spot("a", 50)]);
    expect(cancelBatch(moved).regions).toBe(s.regions);
    const undone = undo(moved);
    expect(undone.regions).toBe(s.regions);
    expect(undone.history.pending).toBeNull();
    expect(undone.history.past).toHaveLength(1);
  });
});
