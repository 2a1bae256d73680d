/**
 * A bitmap cache of the regions layer, so panning and zooming over 1 000 regions costs one image
 * copy per frame instead of re-rasterising every dashed, haloed, hatched shape (in Chromium's
 * software path that raster work dominates a frame).
 *
 * The cache holds the regions painted for one viewport over the visible area plus a margin, on
 * the stage's device-pixel grid. Each frame:
 * - same scene and zoom, view inside the cached area: copy it at the pan offset, rounded to whole
 *   device pixels (so lines stay sharp; at most half a device pixel off until the view settles);
 * - same scene, zoom changing: draw the cache scaled for the moment;
 * - otherwise, or once the view has been still for SETTLE_MS: paint afresh.
 * During a Select drag the dragged region is left out of the cache and painted live on top, so
 * the other 999 are not repainted on every move.
 * Browser only (creates a canvas); `planRaster` holds the decision and is unit-tested.
 */
import type { Bounds } from "@/lib/geometry/bounds";
import type { Region, RegionId } from "@/lib/annotate/types";
import type { Viewport } from "@/lib/annotate/coords";
import { paintScene, type PaintView, type SceneInput } from "./paint-regions";

/** How long the view must be still before a crisp repaint replaces a shifted or scaled copy. */
export const SETTLE_MS = 120;
/** Extra area painted around the visible one, as a share of the stage on each side. */
const MARGIN = 0.25;
/** A cached bitmap is shown stretched to at most twice (or half) the zoom it was painted at. */
export const MAX_STRETCH = 2;

export type RasterKey = Readonly<{ regions: readonly Region[]; excludeId: RegionId | null; hidden: readonly string[]; zones: unknown; styles: unknown }>;

export type CacheState = Readonly<{ key: RasterKey; viewport: Viewport; area: Bounds }>;

/** Same content apart from the excluded region (which a drag replaces on every move). */
export function sameRasterContent(a: RasterKey, b: RasterKey): boolean {
  if (a.excludeId !== b.excludeId || a.hidden !== b.hidden || a.zones !== b.zones || a.styles !== b.styles) return false;
  if (a.regions === b.regions) return true;
  if (a.regions.length !== b.regions.length) return false;
  return a.regions.every((r, i) => r === b.regions[i] || (r.id === a.excludeId && b.regions[i].id === a.excludeId));
}

function contains(outer: Bounds, inner: Bounds): boolean {
  if (inner.minX > inner.maxX || inner.minY > inner.maxY) return true;
  return inner.minX >= outer.minX && inner.minY >= outer.minY && inner.maxX <= outer.maxX && inner.maxY <= outer.maxY;
}

export type RasterPlan = "copy" | "scaled-copy" | "repaint";

export type FrameView = Readonly<{
  viewport: Viewport;
  /** The part of the visible area where anything can be painted (the photo plus a margin). */
  needed: Bounds;
  /** The zoom of the previous frame: a scaled copy only stands in while the zoom is moving. */
  previousScale: number | null;
  /** The view has not changed for SETTLE_MS: shifted or scaled copies give way to a fresh paint. */
  settled: boolean;
}>;

/** What to do this frame. */
export function planRaster(cache: CacheState | null, key: RasterKey, frame: FrameView): RasterPlan {
  if (!cache || !sameRasterContent(cache.key, key)) return "repaint";
  const { viewport, needed } = frame;
  const exact = cache.viewport.scale === viewport.scale && cache.viewport.offsetX === viewport.offsetX && cache.viewport.offsetY === viewport.offsetY;
  if (exact) return contains(cache.area, needed) ? "copy" : "repaint";
  if (frame.settled) return "repaint";
  if (cache.viewport.scale === viewport.scale) return contains(cache.area, needed) ? "copy" : "repaint";
  // Zooming: stretch the old bitmap for now (by at most MAX_STRETCH either way, beyond that it
  // is too blurry); once the zoom stops moving (e.g. a pan at the new zoom), paint afresh.
  const stretch = viewport.scale / cache.viewport.scale;
  const zooming = frame.previousScale !== null && frame.previousScale !== viewport.scale;
  return zooming && stretch <= MAX_STRETCH && stretch >= 1 / MAX_STRETCH ? "scaled-copy" : "repaint";
}

/** Intersection of two boxes (empty boxes have min > max and are contained by anything). */
export function intersect(a: Bounds, b: Bounds): Bounds {
  return { minX: Math.max(a.minX, b.minX), minY: Math.max(a.minY, b.minY), maxX: Math.min(a.maxX, b.maxX), maxY: Math.min(a.maxY, b.maxY) };
}

function expanded(visible: Bounds, margin: number): Bounds {
  const dx = (visible.maxX - visible.minX) * margin;
  const dy = (visible.maxY - visible.minY) * margin;
  return { minX: visible.minX - dx, minY: visible.minY - dy, maxX: visible.maxX + dx, maxY: visible.maxY + dy };
}

export class RegionRaster {
  private canvas: HTMLCanvasElement | null = null;
  private state: CacheState | null = null;
  private previousScale: number | null = null;

  /**
   * Paints the scene (minus `excludeId`) into `target`, whose transform is image space ×
   * pixelRatio. `content` bounds everything that can be painted (image px).
   */
  draw(target: CanvasRenderingContext2D, scene: SceneInput, view: PaintView, viewport: Viewport, pixelRatio: number, excludeId: RegionId | null, settled: boolean, content: Bounds): RasterPlan {
    const key: RasterKey = { regions: scene.regions, excludeId, hidden: scene.hiddenDefects, zones: scene.zones, styles: scene.styles };
    const frame: FrameView = { viewport, needed: intersect(view.visible, content), previousScale: this.previousScale, settled };
    const plan = planRaster(this.state, key, frame);
    this.previousScale = viewport.scale;
    if (plan === "repaint" || !this.canvas || !this.state) this.repaint(scene, view, viewport, pixelRatio, key, content);
    const cache = this.state!;
    const canvas = this.canvas!;
    target.save();
    if (plan === "scaled-copy") {
      // Image space: the cached area stretched to where it lies at the new zoom.
      const { area } = cache;
      target.drawImage(canvas, area.minX, area.minY, area.maxX - area.minX, area.maxY - area.minY);
    } else {
      // Device pixels: where the cache's top-left corner is now, rounded to the pixel grid.
      const x = Math.round((cache.area.minX * viewport.scale + viewport.offsetX) * pixelRatio);
      const y = Math.round((cache.area.minY * viewport.scale + viewport.offsetY) * pixelRatio);
      target.setTransform(1, 0, 0, 1, 0, 0);
      target.drawImage(canvas, x, y);
    }
    target.restore();
    return plan;
  }

  private repaint(scene: SceneInput, view: PaintView, viewport: Viewport, pixelRatio: number, key: RasterKey, content: Bounds): void {
    // Only where something can be painted: zoomed far out, the view is mostly empty stage.
    let area = intersect(expanded(view.visible, MARGIN), content);
    if (area.minX >= area.maxX || area.minY >= area.maxY) area = { minX: view.visible.minX, minY: view.visible.minY, maxX: view.visible.minX, maxY: view.visible.minY };
    // Snap the area's corner to the device-pixel grid of this viewport so copies line up exactly.
    const originX = Math.floor((area.minX * viewport.scale + viewport.offsetX) * pixelRatio);
    const originY = Math.floor((area.minY * viewport.scale + viewport.offsetY) * pixelRatio);
    const width = Math.ceil((area.maxX - area.minX) * viewport.scale * pixelRatio) + 2;
    const height = Math.ceil((area.maxY - area.minY) * viewport.scale * pixelRatio) + 2;
    const k = viewport.scale * pixelRatio;
    const snapped: Bounds = {
      minX: (originX / pixelRatio - viewport.offsetX) / viewport.scale,
      minY: (originY / pixelRatio - viewport.offsetY) / viewport.scale,
      maxX: ((originX + width) / pixelRatio - viewport.offsetX) / viewport.scale,
      maxY: ((originY + height) / pixelRatio - viewport.offsetY) / viewport.scale,
    };
    this.canvas ??= document.createElement("canvas");
    if (this.canvas.width !== width || this.canvas.height !== height) {
      this.canvas.width = width;
      this.canvas.height = height;
    }
    const ctx = this.canvas.getContext("2d")!;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.clearRect(0, 0, width, height);
    ctx.setTransform(k, 0, 0, k, -snapped.minX * k, -snapped.minY * k);
    const regions = key.excludeId === null ? scene.regions : scene.regions.filter((r) => r.id !== key.excludeId);
    paintScene(ctx, { ...scene, regions }, { scale: view.scale, visible: snapped });
    this.state = { key, viewport, area: snapped };
  }
}
