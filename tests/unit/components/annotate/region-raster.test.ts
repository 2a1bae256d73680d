import { describe, expect, it } from "vitest";
import { intersect, MAX_STRETCH, planRaster, sameRasterContent, type CacheState, type RasterKey } from "@/components/annotate/region-raster";
import type { Region } from "@/lib/annotate/types";

const rect = (id: string, x: number): Region => ({ id, role: "defect", defect: "dent", shape: { kind: "rect", x, y: 0, width: 10, height: 10 } });
const regions = [rect("a", 0), rect("b", 20), rect("c", 40)];
const hidden: string[] = [];
const zones: unknown[] = [];
const styles = new Map();
const key = (over: Partial<RasterKey> = {}): RasterKey => ({ regions, excludeId: null, hidden, zones, styles, ...over });
const viewport = { scale: 0.5, offsetX: 10, offsetY: 20 };
const cache: CacheState = { key: key(), viewport, area: { minX: -100, minY: -100, maxX: 1100, maxY: 900 } };
const inside = { minX: 0, minY: 0, maxX: 1000, maxY: 800 };
const frame = (over: Partial<Parameters<typeof planRaster>[2]> = {}) => ({ viewport, needed: inside, previousScale: 0.5, settled: false, ...over });

describe("when the regions layer may copy its cached bitmap", () => {
  it("copies while the content and zoom are the same and the view stays inside the cached area", () => {
    expect(planRaster(cache, key(), frame())).toBe("copy");
    expect(planRaster(cache, key(), frame({ viewport: { ...viewport, offsetX: 55 } }))).toBe("copy");
  });

  it("repaints when there is no cache, the content changed, or the view left the cached area", () => {
    expect(planRaster(null, key(), frame())).toBe("repaint");
    expect(planRaster(cache, key({ regions: [...regions, rect("d", 60)] }), frame())).toBe("repaint");
    expect(planRaster(cache, key({ hidden: ["dent"] }), frame())).toBe("repaint");
    expect(planRaster(cache, key(), frame({ needed: { ...inside, maxX: 1200 } }))).toBe("repaint");
  });

  it("repaints a shifted copy once the view has settled", () => {
    expect(planRaster(cache, key(), frame({ viewport: { ...viewport, offsetX: 55 }, settled: true }))).toBe("repaint");
    expect(planRaster(cache, key(), frame({ settled: true }))).toBe("copy");
  });

  it("stretches the bitmap while zooming, up to MAX_STRETCH, and repaints when the zoom stops", () => {
    expect(planRaster(cache, key(), frame({ viewport: { ...viewport, scale: 0.6 }, previousScale: 0.55 }))).toBe("scaled-copy");
    expect(planRaster(cache, key(), frame({ viewport: { ...viewport, scale: 0.5 * MAX_STRETCH * 1.01 }, previousScale: 0.9 }))).toBe("repaint");
    expect(planRaster(cache, key(), frame({ viewport: { ...viewport, scale: 0.6 }, previousScale: 0.6 }))).toBe("repaint");
  });

  it("lets a drag change the excluded region without repainting the others", () => {
    const dragging = key({ excludeId: "b" });
    const dragCache: CacheState = { ...cache, key: dragging };
    const moved = regions.map((r) => (r.id === "b" ? rect("b", 25) : r));
    expect(sameRasterContent(dragging, key({ excludeId: "b", regions: moved }))).toBe(true);
    expect(planRaster(dragCache, key({ excludeId: "b", regions: moved }), frame())).toBe("copy");
    const otherMoved = regions.map((r) => (r.id === "c" ? rect("c", 45) : r));
    expect(sameRasterContent(dragging, key({ excludeId: "b", regions: otherMoved }))).toBe(false);
    expect(sameRasterContent(dragging, key({ excludeId: null, regions: moved }))).toBe(false);
  });

  it("treats an empty needed area (the view is off the photo) as covered", () => {
    const off = intersect({ minX: 5000, minY: 0, maxX: 6000, maxY: 100 }, { minX: 0, minY: 0, maxX: 4000, maxY: 3000 });
    expect(off.minX).toBeGreaterThan(off.maxX);
    expect(planRaster(cache, key(), frame({ needed: off }))).toBe("copy");
  });
});
