import { describe, expect, it } from "vitest";
import { canvasReducer, edit, type CanvasStore } from "@/components/annotate/canvas-store";
import { imagePoint } from "@/lib/annotate/coords";
import { setViewport } from "@/lib/annotate/model";
import { activateTool, pointerDown, pointerMove } from "@/lib/annotate/tools";
import { NO_MODIFIERS } from "@/lib/annotate/types";
import { makeState } from "../../annotate/helpers";

const storeOf = (state = makeState()): CanvasStore => ({ state, pressBase: null });

describe("canvas store", () => {
  it("returns the same store for an edit that changes nothing (React then skips the render)", () => {
    const store = storeOf();
    expect(
      canvasReducer(
        store,
        edit((s) => s),
      ),
    ).toBe(store);
  });

  it("takes a press back when it turns into a pinch, keeping the view the pinch made", () => {
    const box = storeOf(activateTool(makeState(), "box"));
    const pressed = canvasReducer(box, { type: "press", edit: (s) => pointerDown(s, imagePoint(100, 100), NO_MODIFIERS) });
    expect(pressed.state.draft?.tool).toBe("box");
    const moved = canvasReducer(
      pressed,
      edit((s) => pointerMove(s, imagePoint(300, 250), NO_MODIFIERS)),
    );
    const zoomed = canvasReducer(
      moved,
      edit((s) => setViewport(s, { scale: 2, offsetX: -50, offsetY: 10 })),
    );
    const cancelled = canvasReducer(zoomed, { type: "cancel-press" });
    expect(cancelled.state.draft).toBeNull();
    expect(cancelled.state.regions).toBe(box.state.regions);
    expect(cancelled.state.viewport).toEqual({ scale: 2, offsetX: -50, offsetY: 10 });
    expect(cancelled.pressBase).toBeNull();
  });

  it("forgets the press on release, so a later cancel does nothing", () => {
    const box = storeOf(activateTool(makeState(), "box"));
    const pressed = canvasReducer(box, { type: "press", edit: (s) => pointerDown(s, imagePoint(100, 100), NO_MODIFIERS) });
    const released = canvasReducer(pressed, { type: "release", edit: (s) => s });
    expect(released.pressBase).toBeNull();
    expect(canvasReducer(released, { type: "cancel-press" })).toBe(released);
  });
});
