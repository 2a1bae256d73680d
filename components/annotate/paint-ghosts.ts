/**
 * Suggestions painted as ghosts: an unfilled outline in the class's colour with one dash rhythm
 * of their own (long dash, long gap) over a halo, so a ghost never looks like a saved region.
 * A ghost Spot smaller than a fingertip on screen gets a ring around it, so a one-pixel candidate
 * can still be seen on a zoomed-out photo.
 */
import { boundsOfShape } from "@/lib/geometry/bounds";
import { SURFACE_STYLE, UNKNOWN_DEFECT_STYLE, type RegionStyle } from "@/lib/annotate/defect-styles";
import { boxesOverlap, paintLabel, shapePath, strokeStyled, type PaintView } from "./paint-regions";
import type { GhostShape } from "./types";

const GHOST_DASH = [10, 7];
const MIN_RING_PX = 9;

function ghostStyle(ghost: GhostShape, styles: ReadonlyMap<string, RegionStyle>): RegionStyle {
  const base = ghost.role === "surface" ? SURFACE_STYLE : (styles.get(ghost.defect) ?? UNKNOWN_DEFECT_STYLE);
  return { ...base, stroke: { name: "suggestion", dash: GHOST_DASH, lineCap: "butt" }, fill: "none", tintOpacity: 0 };
}

export const ghostCaption = (ghost: GhostShape): string => (ghost.role === "defect" && ghost.learned ? ghost.label : "suggested");

export function paintGhosts(ctx: CanvasRenderingContext2D, ghosts: readonly GhostShape[], styles: ReadonlyMap<string, RegionStyle>, view: PaintView): void {
  for (const ghost of ghosts) {
    const box = boundsOfShape(ghost.shape, { includeStroke: true });
    if (!boxesOverlap(box, view.visible)) continue;
    const style = ghostStyle(ghost, styles);
    strokeStyled(ctx, shapePath(ghost.shape), style, view.scale);
    if (ghost.shape.kind === "spot" && ghost.shape.radius * view.scale < MIN_RING_PX) {
      const ring = new Path2D();
      ring.arc(ghost.shape.x, ghost.shape.y, MIN_RING_PX / view.scale, 0, Math.PI * 2);
      strokeStyled(ctx, ring, style, view.scale, 1.5);
    }
    // A learned ghost says its class and score on the photo; the others only that they are suggestions.
    if (ghosts.length <= 20) paintLabel(ctx, ghostCaption(ghost), box.minX, box.maxY + 4 / view.scale, view.scale);
  }
  ctx.setLineDash([]);
}
