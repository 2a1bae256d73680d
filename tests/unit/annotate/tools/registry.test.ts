import { describe, expect, it } from "vitest";
import { selectRegion } from "@/lib/annotate/model";
import { activateTool, handleKey, shortcutSheet, TOOLS } from "@/lib/annotate/tools";
import type { Region } from "@/lib/annotate/types";
import { dragSteps, drive, makeState } from "../helpers";

const key = (k: string, mods: Partial<{ shift: boolean; alt: boolean; mod: boolean }> = {}) => ({ key: k, shift: false, alt: false, mod: false, ...mods });
const box: Region = { id: "b1", role: "defect", defect: "dent", shape: { kind: "rect", x: 10, y: 10, width: 50, height: 50 } };

describe("tool registry", () => {
  it("has the seven tools with distinct keys, each in the shortcut sheet", () => {
    expect(TOOLS.map((t) => t.label)).toEqual(["Select", "Box", "Outline", "Line", "Spot", "Surface", "Ruler"]);
    expect(new Set(TOOLS.map((t) => t.key)).size).toBe(TOOLS.length);
    const sheet = shortcutSheet();
    const toolKeys = sheet.find((g) => g.title === "Tools")!.shortcuts.map((s) => s.keys);
    expect(toolKeys).toEqual(TOOLS.map((t) => t.key.toUpperCase()));
    expect(sheet.map((g) => g.title)).toEqual(["Everywhere", "Tools", ...TOOLS.map((t) => t.label)]);
  });

  it("switches tools by letter (either case), dropping the drawing and clearing the selection", () => {
    let s = makeState({ regions: [box] });
    s = selectRegion(s, "b1");
    s = handleKey(s, key("B", { shift: true })).state;
    expect(s.activeTool).toBe("box");
    expect(s.selectedId).toBeNull();
    s = drive(s, [
      ["down", 100, 100],
      ["move", 150, 150],
    ]);
    s = handleKey(s, key("o")).state;
    expect(s.activeTool).toBe("outline");
    expect(s.draft).toBeNull();
    expect(handleKey(s, key("o")).state).toBe(s);
  });

  it("cancels a drag in progress when the tool changes", () => {
    const dragging = drive(makeState({ regions: [box] }), [
      ["down", 30, 30],
      ["move", 300, 300],
    ]);
    const switched = activateTool(dragging, "spot");
    expect(switched.regions).toEqual([box]);
    expect(switched.history.pending).toBeNull();
  });

  it("maps number keys to classes and changes the selected region's class", () => {
    const s = selectRegion(makeState({ regions: [box] }), "b1");
    const result = handleKey(s, key("2"));
    expect(result.handled).toBe(true);
    expect(result.state.activeDefect).toBe("crack");
    expect(result.state.regions[0]).toMatchObject({ defect: "crack" });
    expect(handleKey(s, key("9")).state).toBe(s);
  });

  it("undoes with Ctrl/Cmd+Z and redoes with Shift+Ctrl/Cmd+Z or Ctrl/Cmd+Y", () => {
    const drawn = drive(activateTool(makeState(), "box"), dragSteps(10, 10, 80, 80));
    const undone = handleKey(drawn, key("z", { mod: true }));
    expect(undone).toMatchObject({ handled: true });
    expect(undone.state.regions).toEqual([]);
    expect(handleKey(undone.state, key("Z", { mod: true, shift: true })).state.regions).toEqual(drawn.regions);
    expect(handleKey(undone.state, key("y", { mod: true })).state.regions).toEqual(drawn.regions);
  });

  it("asks for the sheet on ? and leaves other keys and browser shortcuts alone", () => {
    const s = makeState();
    expect(handleKey(s, key("?", { shift: true }))).toEqual({ state: s, handled: true, showShortcuts: true });
    expect(handleKey(s, key("q"))).toEqual({ state: s, handled: false });
    expect(handleKey(s, key("b", { mod: true }))).toEqual({ state: s, handled: false });
    expect(handleKey(s, key("Enter"))).toEqual({ state: s, handled: false });
  });

  it("refuses drawing tools without a defect class but allows Surface and Ruler", () => {
    const none = makeState({ allowedDefects: [] });
    for (const id of ["box", "outline", "line", "spot"] as const) expect(activateTool(none, id).activeTool).toBe("select");
    expect(activateTool(none, "surface").activeTool).toBe("surface");
    expect(activateTool(none, "ruler").activeTool).toBe("ruler");
  });
});
