/**
 * Hatch and dot fills as canvas patterns (browser only; created on first use). A tile is drawn
 * at twice its CSS size for sharp hi-DPI screens, and its pattern transform is set to
 * 1 / (2 × scale) so the hatching keeps the same spacing on screen at every zoom.
 */
import type { FillPattern } from "@/lib/annotate/defect-styles";

/** Tile edge in CSS px: hatch lines 8 px apart (our own choice). */
const TILE_PX = 8;
const TILE_RESOLUTION = 2;

type CachedPattern = { pattern: CanvasPattern; scale: number };
const byContext = new WeakMap<CanvasRenderingContext2D, Map<string, CachedPattern>>();

function drawTile(tile: CanvasRenderingContext2D, fill: FillPattern, colour: string): void {
  const s = TILE_PX * TILE_RESOLUTION;
  const path = new Path2D();
  if (fill === "hatch-forward" || fill === "cross-hatch") {
    // Three parallel diagonals so the lines continue seamlessly across tile edges.
    for (const k of [-1, 0, 1]) {
      path.moveTo(k * s, s);
      path.lineTo(k * s + s, 0);
    }
  }
  if (fill === "hatch-back" || fill === "cross-hatch") {
    for (const k of [-1, 0, 1]) {
      path.moveTo(k * s, 0);
      path.lineTo(k * s + s, s);
    }
  }
  if (fill === "rows") {
    path.moveTo(0, s / 2);
    path.lineTo(s, s / 2);
  }
  if (fill === "dots") path.arc(s / 2, s / 2, 1.6 * TILE_RESOLUTION, 0, Math.PI * 2);
  const dots = fill === "dots";
  // A dark underlay makes light colours (yellow, white) readable on a light photo.
  tile.lineWidth = 2.6 * TILE_RESOLUTION;
  tile.strokeStyle = "rgba(0, 0, 0, 0.45)";
  tile.fillStyle = colour;
  tile.stroke(path);
  if (dots) tile.fill(path);
  else {
    tile.lineWidth = 1.2 * TILE_RESOLUTION;
    tile.strokeStyle = colour;
    tile.stroke(path);
  }
}

function createTile(fill: FillPattern, colour: string): HTMLCanvasElement | null {
  if (typeof document === "undefined") return null;
  const canvas = document.createElement("canvas");
  canvas.width = TILE_PX * TILE_RESOLUTION;
  canvas.height = TILE_PX * TILE_RESOLUTION;
  const tile = canvas.getContext("2d");
  if (!tile) return null;
  drawTile(tile, fill, colour);
  return canvas;
}

/** The repeating fill for `fill` in `colour`, scaled for the current zoom; null when unavailable. */
export function fillPattern(ctx: CanvasRenderingContext2D, fill: FillPattern, colour: string, scale: number): CanvasPattern | null {
  let cache = byContext.get(ctx);
  if (!cache) byContext.set(ctx, (cache = new Map()));
  const key = `${fill}|${colour}`;
  let entry = cache.get(key);
  if (!entry) {
    const tile = createTile(fill, colour);
    const pattern = tile ? ctx.createPattern(tile, "repeat") : null;
    if (!pattern) return null;
    entry = { pattern, scale: Number.NaN };
    cache.set(key, entry);
  }
  if (entry.scale !== scale) {
    const k = 1 / (TILE_RESOLUTION * scale);
    entry.pattern.setTransform(new DOMMatrix([k, 0, 0, k, 0, 0]));
    entry.scale = scale;
  }
  return entry.pattern;
}
