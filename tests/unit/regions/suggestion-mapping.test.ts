/**
 * Suggestions mapped to original pixels. The preview → original mapping is the per-axis scale the
 * canvas draws the preview with (lib/annotate/coords.ts imageNodeScale); hand-computed values.
 */
import { describe, expect, it } from "vitest";
import { panelFor } from "@/lib/grading/measure-photo";
import { candidateGhosts, isScreenView, scalePolygon } from "@/lib/regions/suggestion-mapping";
import type { PixelCandidate } from "@/lib/imaging/pixel-candidates";

describe("suggestion mapping", () => {
  it("scales a Surface found on a 2560 × 1920 preview to the 4000 × 3000 original, per axis, clamped", () => {
    const shape = scalePolygon(
      {
        kind: "polygon",
        points: [
          [0, 0],
          [1280, 960],
          [2560, 1920],
          [2600, 10],
        ],
      },
      { width: 2560, height: 1920 },
      { width: 4000, height: 3000 },
    );
    // 4000 / 2560 = 1.5625 and 3000 / 1920 = 1.5625: (1280, 960) → (2000, 1500).
    expect(shape.points).toEqual([
      [0, 0],
      [2000, 1500],
      [4000, 3000],
      [4000, 15.63],
    ]);
  });

  it("turns pixel candidates into Spots of their class, at least 1 px in radius; unknown classes are counted", () => {
    const c = (kind: PixelCandidate["kind"], x: number, radius: number): PixelCandidate => ({ x, y: 20, radius, kind, score: 0.8, areaPx: 1 });
    const { ghosts, withoutClass } = candidateGhosts([c("pixel-lit", 10.5, 0.5), c("pixel-subpixel", 30, 2)], [{ key: "pixel-lit", label: "Always-lit pixel" }], { width: 100, height: 100 });
    expect(ghosts).toEqual([{ id: "candidate-1", role: "defect", defect: "pixel-lit", shape: { kind: "spot", x: 10.5, y: 20, radius: 1 }, label: "Always-lit pixel (score 80 %)" }]);
    expect(withoutClass).toBe(1);
  });

  it("agrees with the measurement's rule for which views are test screens", () => {
    for (const panelResolution of [null, { width: 1080, height: 2400 }]) {
      for (const viewKey of ["screen-white", "screen-black", "front", "back", "screenshot"]) {
        expect(isScreenView({ panelResolution }, viewKey)).toBe(panelFor({ panelResolution, viewKey, defects: [] }) !== null);
      }
    }
  });
});
