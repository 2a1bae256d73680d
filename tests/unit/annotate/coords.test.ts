import { describe, expect, it } from "vitest";
import {
  clampScale,
  DEFAULT_SCALE_LIMITS,
  fitToView,
  imageNodeScale,
  imagePoint,
  oneToOne,
  pan,
  previewIsMagnified,
  previewScaleOf,
  stagePoint,
  stageToImageDistance,
  toImage,
  toStage,
  visibleImageBounds,
  wheelZoomFactor,
  zoomAround,
  type Viewport,
} from "@/lib/annotate/coords";

const viewport: Viewport = { scale: 0.25, offsetX: 40, offsetY: -12 };

describe("image ↔ stage", () => {
  it("maps by stage = image × scale + offset", () => {
    expect(toStage(viewport, imagePoint(400, 800))).toEqual({ x: 140, y: 188 });
    expect(toImage(viewport, stagePoint(140, 188))).toEqual({ x: 400, y: 800 });
  });

  it("round-trips both ways", () => {
    for (const [x, y] of [
      [0, 0],
      [3999.5, 2999.25],
      [-10, 1e4],
      [1234.567, 89.01],
    ]) {
      const back = toImage(viewport, toStage(viewport, imagePoint(x, y)));
      expect(back.x).toBeCloseTo(x, 9);
      expect(back.y).toBeCloseTo(y, 9);
      const there = toStage(viewport, toImage(viewport, stagePoint(x, y)));
      expect(there.x).toBeCloseTo(x, 9);
      expect(there.y).toBeCloseTo(y, 9);
    }
  });

  it("converts screen tolerances into image pixels", () => {
    expect(stageToImageDistance(viewport, 6)).toBe(24);
  });
});

describe("zoom around the pointer", () => {
  it("keeps the image point under the pointer where it is", () => {
    const pointer = stagePoint(317, 205);
    const under = toImage(viewport, pointer);
    for (const factor of [1.1, 0.5, 3, wheelZoomFactor(-240)]) {
      const zoomed = zoomAround(viewport, pointer, factor);
      expect(zoomed.scale).toBeCloseTo(viewport.scale * factor, 12);
      const after = toStage(zoomed, under);
      expect(after.x).toBeCloseTo(pointer.x, 9);
      expect(after.y).toBeCloseTo(pointer.y, 9);
    }
  });

  it("clamps the scale and still keeps the point fixed", () => {
    const pointer = stagePoint(10, 700);
    const under = toImage(viewport, pointer);
    const huge = zoomAround(viewport, pointer, 1e6);
    expect(huge.scale).toBe(DEFAULT_SCALE_LIMITS.max);
    expect(toStage(huge, under).x).toBeCloseTo(pointer.x, 6);
    expect(zoomAround(viewport, pointer, 1e-9).scale).toBe(DEFAULT_SCALE_LIMITS.min);
    expect(clampScale(0.5, { min: 1, max: 2 })).toBe(1);
  });

  it("ignores factors that are not positive numbers", () => {
    expect(zoomAround(viewport, stagePoint(0, 0), 0)).toBe(viewport);
    expect(zoomAround(viewport, stagePoint(0, 0), Number.NaN)).toBe(viewport);
  });

  it("returns to the same zoom after scrolling in and back out by the same amount", () => {
    const pointer = stagePoint(50, 60);
    const back = zoomAround(zoomAround(viewport, pointer, wheelZoomFactor(-120)), pointer, wheelZoomFactor(120));
    expect(back.scale).toBeCloseTo(viewport.scale, 12);
    expect(back.offsetX).toBeCloseTo(viewport.offsetX, 9);
  });

  it("goes to one original pixel per stage pixel around a point", () => {
    const anchor = stagePoint(400, 300);
    const under = toImage(viewport, anchor);
    const actual = oneToOne(viewport, anchor);
    expect(actual.scale).toBe(1);
    expect(toStage(actual, under).x).toBeCloseTo(400, 9);
  });
});

describe("pan and fit", () => {
  it("pans by stage pixels", () => {
    expect(pan(viewport, 5, -7)).toEqual({ scale: 0.25, offsetX: 45, offsetY: -19 });
  });

  it("fits and centres a landscape photo in a stage", () => {
    // 4000 × 3000 into 1000 × 500 with 20 px padding: min(960/4000, 460/3000) = 0.15333…
    const fit = fitToView({ width: 4000, height: 3000 }, { width: 1000, height: 500 }, 20);
    expect(fit.scale).toBeCloseTo(460 / 3000, 12);
    expect(fit.offsetY).toBeCloseTo(20, 9);
    expect(fit.offsetX).toBeCloseTo((1000 - 4000 * fit.scale) / 2, 9);
    const centre = toStage(fit, imagePoint(2000, 1500));
    expect(centre.x).toBeCloseTo(500, 9);
    expect(centre.y).toBeCloseTo(250, 9);
  });

  it("fits a portrait photo by its width when that is the tighter side", () => {
    const fit = fitToView({ width: 1000, height: 2000 }, { width: 300, height: 1000 }, 0);
    expect(fit.scale).toBeCloseTo(0.3, 12);
    expect(fit.offsetX).toBeCloseTo(0, 9);
  });

  it("refuses an empty photo", () => {
    expect(() => fitToView({ width: 0, height: 10 }, { width: 10, height: 10 })).toThrow(RangeError);
  });

  it("reports the visible part of the image", () => {
    expect(visibleImageBounds({ scale: 0.5, offsetX: 100, offsetY: 0 }, { width: 800, height: 600 })).toEqual({ minX: -200, minY: 0, maxX: 1400, maxY: 1200 });
  });
});

describe("drawing the preview in original coordinates", () => {
  it("scales the preview node by 1 / previewScale, per axis", () => {
    const original = { width: 4000, height: 3001 };
    const preview = { width: 2560, height: 1921 }; // long edge 2560, height rounded
    expect(previewScaleOf(preview, original)).toBe(0.64);
    const { scaleX, scaleY } = imageNodeScale(preview, original);
    expect(preview.width * scaleX).toBe(original.width);
    expect(preview.height * scaleY).toBeCloseTo(original.height, 9);
    expect(scaleX).toBeCloseTo(1 / 0.64, 12);
  });

  it("says when the preview is magnified past its resolution", () => {
    expect(previewIsMagnified({ scale: 0.5, offsetX: 0, offsetY: 0 }, 0.64)).toBe(false);
    expect(previewIsMagnified({ scale: 1, offsetX: 0, offsetY: 0 }, 0.64)).toBe(true);
  });
});
