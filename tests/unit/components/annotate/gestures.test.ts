import { describe, expect, it } from "vitest";
import { stagePoint, toImage, toStage, imagePoint, type Viewport } from "@/lib/annotate/coords";
import { DOUBLE_CLICK_MS, nextClick, pinchViewport, revealBounds, wheelViewport } from "@/components/annotate/gestures";

const start: Viewport = { scale: 0.25, offsetX: 40, offsetY: -12 };

describe("two-finger pinch", () => {
  it("zooms by the ratio of finger distances and keeps the image point between the fingers under them", () => {
    const a = stagePoint(100, 200);
    const b = stagePoint(300, 200);
    const under = toImage(start, stagePoint(200, 200));
    // Fingers spread from 200 px to 500 px apart around a midpoint that also moves to (260, 230).
    const next = pinchViewport({ viewport: start, a, b }, stagePoint(10, 230), stagePoint(510, 230));
    expect(next.scale).toBeCloseTo(0.25 * (500 / 200), 12);
    const there = toStage(next, under);
    expect(there.x).toBeCloseTo(260, 9);
    expect(there.y).toBeCloseTo(230, 9);
  });

  it("pans without zooming when both fingers move together", () => {
    const next = pinchViewport({ viewport: start, a: stagePoint(100, 100), b: stagePoint(200, 160) }, stagePoint(130, 90), stagePoint(230, 150));
    expect(next).toEqual({ scale: 0.25, offsetX: 70, offsetY: -22 });
  });

  it("gives the same view applied step by step as in one step (the canvas applies it per move)", () => {
    const a0 = stagePoint(100, 100),
      b0 = stagePoint(200, 100);
    const a1 = stagePoint(80, 110),
      b1 = stagePoint(240, 90);
    const a2 = stagePoint(50, 120),
      b2 = stagePoint(300, 80);
    const stepwise = pinchViewport({ viewport: pinchViewport({ viewport: start, a: a0, b: b0 }, a1, b1), a: a1, b: b1 }, a2, b2);
    const direct = pinchViewport({ viewport: start, a: a0, b: b0 }, a2, b2);
    expect(stepwise.scale).toBeCloseTo(direct.scale, 12);
    expect(stepwise.offsetX).toBeCloseTo(direct.offsetX, 9);
    expect(stepwise.offsetY).toBeCloseTo(direct.offsetY, 9);
  });

  it("clamps the zoom to the limits", () => {
    const next = pinchViewport({ viewport: start, a: stagePoint(0, 0), b: stagePoint(10, 0) }, stagePoint(0, 0), stagePoint(10_000, 0), { min: 0.01, max: 4 });
    expect(next.scale).toBe(4);
  });

  it("only pans when the fingers start on one spot (no usable ratio)", () => {
    const next = pinchViewport({ viewport: start, a: stagePoint(50, 50), b: stagePoint(50.5, 50) }, stagePoint(60, 50), stagePoint(160, 50));
    expect(next.scale).toBe(0.25);
  });
});

describe("wheel", () => {
  const anchor = stagePoint(400, 300);
  it("zooms in on a wheel turn away from the user (negative deltaY), around the pointer", () => {
    const under = toImage(start, anchor);
    const next = wheelViewport(start, { deltaX: 0, deltaY: -100, deltaMode: 0, ctrlKey: false }, anchor);
    expect(next.scale).toBeGreaterThan(start.scale);
    expect(toStage(next, under).x).toBeCloseTo(400, 9);
    expect(toStage(next, under).y).toBeCloseTo(300, 9);
  });

  it("undoes a turn with the opposite turn", () => {
    const there = wheelViewport(start, { deltaX: 0, deltaY: -120, deltaMode: 0, ctrlKey: false }, anchor);
    const back = wheelViewport(there, { deltaX: 0, deltaY: 120, deltaMode: 0, ctrlKey: false }, anchor);
    expect(back.scale).toBeCloseTo(start.scale, 12);
    expect(back.offsetX).toBeCloseTo(start.offsetX, 9);
  });

  it("reads line-mode deltas as 16 px per line", () => {
    const lines = wheelViewport(start, { deltaX: 0, deltaY: -3, deltaMode: 1, ctrlKey: false }, anchor);
    const pixels = wheelViewport(start, { deltaX: 0, deltaY: -48, deltaMode: 0, ctrlKey: false }, anchor);
    expect(lines).toEqual(pixels);
  });

  it("pans on a mostly sideways scroll and zooms on a trackpad pinch (ctrlKey)", () => {
    expect(wheelViewport(start, { deltaX: 30, deltaY: 4, deltaMode: 0, ctrlKey: false }, anchor)).toEqual({ ...start, offsetX: 10 });
    expect(wheelViewport(start, { deltaX: 30, deltaY: -4, deltaMode: 0, ctrlKey: true }, anchor).scale).toBeGreaterThan(start.scale);
  });
});

describe("double-click counting", () => {
  it("counts a second press close in time and place as a double-click", () => {
    const first = nextClick(null, 1000, stagePoint(10, 10));
    expect(first.count).toBe(1);
    expect(nextClick(first, 1000 + DOUBLE_CLICK_MS - 1, stagePoint(13, 12)).count).toBe(2);
    expect(nextClick(nextClick(first, 1200, stagePoint(10, 10)), 1300, stagePoint(10, 10)).count).toBe(3);
  });

  it("starts again when too late or too far", () => {
    const first = nextClick(null, 1000, stagePoint(10, 10));
    expect(nextClick(first, 1000 + DOUBLE_CLICK_MS + 1, stagePoint(10, 10)).count).toBe(1);
    expect(nextClick(first, 1100, stagePoint(30, 10)).count).toBe(1);
  });
});

describe("revealBounds", () => {
  const stage = { width: 800, height: 600 };
  it("leaves the view alone when the box is already on screen", () => {
    const view: Viewport = { scale: 0.5, offsetX: 0, offsetY: 0 };
    expect(revealBounds(view, { minX: 100, minY: 100, maxX: 200, maxY: 200 }, stage)).toBe(view);
  });

  it("centres an off-screen box at the same zoom", () => {
    const view: Viewport = { scale: 0.5, offsetX: 0, offsetY: 0 };
    const next = revealBounds(view, { minX: 3000, minY: 2000, maxX: 3200, maxY: 2100 }, stage);
    expect(next.scale).toBe(0.5);
    const centre = toStage(next, imagePoint(3100, 2050));
    expect(centre).toEqual({ x: 400, y: 300 });
  });
});
