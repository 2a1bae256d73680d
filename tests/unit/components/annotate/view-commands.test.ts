import { describe, expect, it } from "vitest";
import { fitToView, stagePoint, toImage, toStage, type Viewport } from "@/lib/annotate/coords";
import { applyViewCommand, viewCommandForKey, ZOOM_STEP } from "@/components/annotate/view-commands";

const key = (k: string, extra: Partial<{ code: string; shift: boolean; alt: boolean; mod: boolean }> = {}) => viewCommandForKey({ key: k, shift: false, alt: false, mod: false, ...extra });

describe("view keys", () => {
  it("maps + = − _ 0 and Shift+0", () => {
    expect(key("+", { shift: true })).toBe("zoom-in");
    expect(key("=")).toBe("zoom-in");
    expect(key("-")).toBe("zoom-out");
    expect(key("_", { shift: true })).toBe("zoom-out");
    expect(key("0", { code: "Digit0" })).toBe("fit");
    expect(key(")", { code: "Digit0", shift: true })).toBe("one-to-one");
    expect(key("=", { code: "Digit0", shift: true })).toBe("one-to-one"); // German layout: Shift+0 is "="
  });

  it("leaves digits 1–9, letters and browser shortcuts alone", () => {
    for (const k of ["1", "9", "b", "z"]) expect(key(k)).toBeNull();
    expect(key("0", { mod: true })).toBeNull(); // Ctrl+0 resets the browser's zoom
    expect(key("+", { alt: true })).toBeNull();
  });
});

describe("applyViewCommand", () => {
  const image = { width: 4000, height: 3000 };
  const stage = { width: 1000, height: 600 };
  const view: Viewport = { scale: 0.2, offsetX: 100, offsetY: 0 };

  it("zooms by one step around the stage centre", () => {
    const centre = stagePoint(500, 300);
    const under = toImage(view, centre);
    const next = applyViewCommand(view, "zoom-in", image, stage);
    expect(next.scale).toBeCloseTo(0.2 * ZOOM_STEP, 12);
    expect(toStage(next, under).x).toBeCloseTo(500, 9);
    expect(applyViewCommand(next, "zoom-out", image, stage).scale).toBeCloseTo(0.2, 12);
  });

  it("fits the photo and goes to 1:1", () => {
    expect(applyViewCommand(view, "fit", image, stage)).toEqual(fitToView(image, stage));
    expect(applyViewCommand(view, "one-to-one", image, stage).scale).toBe(1);
  });
});
