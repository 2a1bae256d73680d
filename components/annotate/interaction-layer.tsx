"use client";

import type Konva from "konva";
import { memo, useCallback, useMemo } from "react";
import { Circle, Layer, Line, Rect, Shape } from "react-konva";
import { CLOSE_TOLERANCE_PX } from "@/lib/annotate/constants";
import { toShapePoint, type Viewport } from "@/lib/annotate/coords";
import { handlesOf } from "@/lib/annotate/hit-test";
import type { Draft, Region } from "@/lib/annotate/types";
import { hexWithAlpha, type RegionStyle } from "@/lib/annotate/defect-styles";
import { layerTransform, nativeContext, paintViewOf } from "./konva-view";
import { paintGhosts } from "./paint-ghosts";
import { paintHandles, paintRuler, paintSelection } from "./paint-regions";
import type { GhostShape } from "./types";

type InteractionLayerProps = {
  viewport: Viewport;
  draft: Draft | null;
  /** Style of what the draft will become (the active class, or the Surface / Ruler style). */
  draftStyle: RegionStyle;
  /** Width of a Line being drawn, original px. */
  lineWidth: number;
  /** The selected region when it is visible, else null. */
  selected: Region | null;
  showHandles: boolean;
  /** Suggestions waiting to be accepted or dismissed. */
  ghosts: readonly GhostShape[];
  styles: ReadonlyMap<string, RegionStyle>;
};

/** Konva stroke props that stay the same on screen at every zoom (dash lengths too). */
function screenStroke(colour: string, width: number, dash: readonly number[] = []) {
  return { stroke: colour, strokeWidth: width, dash: dash.length ? [...dash] : undefined, strokeScaleEnabled: false, listening: false, perfectDrawEnabled: false };
}

/** A polyline drawn twice: a solid halo under the colour in the style's dashes (as the regions layer draws it). */
function HaloLine({ points, style, closed = false, fill }: { points: number[]; style: RegionStyle; closed?: boolean; fill?: string }) {
  return (
    <>
      <Line points={points} closed={closed} fill={fill} lineJoin="round" {...screenStroke(style.halo, style.strokeWidth + 2)} />
      <Line points={points} closed={closed} lineJoin="round" lineCap={style.stroke.lineCap} {...screenStroke(style.colour, style.strokeWidth, style.stroke.dash)} />
    </>
  );
}

function DraftShape({ draft, style, lineWidth, scale }: { draft: Draft; style: RegionStyle; lineWidth: number; scale: number }) {
  const tint = style.tintOpacity > 0 ? hexWithAlpha(style.colour, style.tintOpacity) : undefined;
  if (draft.tool === "box") {
    const x = Math.min(draft.start.x, draft.current.x);
    const y = Math.min(draft.start.y, draft.current.y);
    const rect = { x, y, width: Math.abs(draft.current.x - draft.start.x), height: Math.abs(draft.current.y - draft.start.y) };
    return (
      <>
        <Rect {...rect} fill={tint} {...screenStroke(style.halo, style.strokeWidth + 2)} />
        <Rect {...rect} {...screenStroke(style.colour, style.strokeWidth, style.stroke.dash)} />
      </>
    );
  }
  if (draft.tool === "spot") {
    return (
      <>
        <Circle x={draft.centre.x} y={draft.centre.y} radius={draft.radius} fill={tint} {...screenStroke(style.halo, style.strokeWidth + 2)} />
        <Circle x={draft.centre.x} y={draft.centre.y} radius={draft.radius} {...screenStroke(style.colour, style.strokeWidth, style.stroke.dash)} />
      </>
    );
  }
  if (draft.tool === "ruler") return null; // painted by the ruler shape below
  const points = draft.points.flatMap((p) => [p.x, p.y]);
  const last = draft.points[draft.points.length - 1];
  const closes = draft.tool !== "line" && draft.points.length >= 3;
  return (
    <>
      {draft.tool === "line" && lineWidth * scale >= 1.5 && (
        <Line points={points} stroke={style.colour} opacity={0.35} strokeWidth={lineWidth} lineCap="round" lineJoin="round" listening={false} perfectDrawEnabled={false} />
      )}
      <HaloLine points={points} style={style} />
      {draft.hover && last && !draft.pressed && <Line points={[last.x, last.y, draft.hover.x, draft.hover.y]} {...screenStroke(style.colour, 1.5, [4, 4])} />}
      {closes && <Circle x={draft.points[0].x} y={draft.points[0].y} radius={CLOSE_TOLERANCE_PX / scale} {...screenStroke(style.colour, 1.5, [2, 3])} />}
    </>
  );
}

/**
 * What is being worked on right now: the selected region's outline and grips, the drawing in
 * progress and the ruler being placed. Few nodes, so it simply re-renders with the view (grip
 * sizes depend on the zoom).
 */
export const InteractionLayer = memo(function InteractionLayer({ viewport, draft, draftStyle, lineWidth, selected, showHandles, ghosts, styles }: InteractionLayerProps) {
  const ghostFunc = useCallback(
    (context: Konva.Context, shape: Konva.Shape) => {
      const view = paintViewOf(shape);
      if (view) paintGhosts(nativeContext(context), ghosts, styles, view);
    },
    [ghosts, styles],
  );
  const selectionFunc = useCallback(
    (context: Konva.Context, shape: Konva.Shape) => {
      const view = paintViewOf(shape);
      if (!view || !selected) return;
      const ctx = nativeContext(context);
      paintSelection(ctx, selected, view);
      if (showHandles)
        paintHandles(
          ctx,
          handlesOf(selected).map((h) => h.point),
          view,
        );
    },
    [selected, showHandles],
  );
  const rulerFunc = useCallback(
    (context: Konva.Context, shape: Konva.Shape) => {
      const view = paintViewOf(shape);
      if (!view || draft?.tool !== "ruler") return;
      paintRuler(nativeContext(context), toShapePoint(draft.a), toShapePoint(draft.b), draft.phase === "length" ? "? mm" : null, view);
    },
    [draft],
  );
  const vertices = useMemo(() => (draft && (draft.tool === "outline" || draft.tool === "surface" || draft.tool === "line") ? draft.points.map(toShapePoint) : null), [draft]);
  const vertexFunc = useCallback(
    (context: Konva.Context, shape: Konva.Shape) => {
      const view = paintViewOf(shape);
      if (view && vertices) paintHandles(nativeContext(context), vertices, view, 6);
    },
    [vertices],
  );
  return (
    // An empty layer is hidden so panning does not clear and composite a blank canvas each frame.
    <Layer listening={false} visible={selected !== null || draft !== null || ghosts.length > 0} {...layerTransform(viewport)}>
      {ghosts.length > 0 && <Shape sceneFunc={ghostFunc} listening={false} perfectDrawEnabled={false} />}
      {selected && <Shape sceneFunc={selectionFunc} listening={false} perfectDrawEnabled={false} />}
      {draft && <DraftShape draft={draft} style={draftStyle} lineWidth={lineWidth} scale={viewport.scale} />}
      {draft?.tool === "ruler" && <Shape sceneFunc={rulerFunc} listening={false} perfectDrawEnabled={false} />}
      {vertices && <Shape sceneFunc={vertexFunc} listening={false} perfectDrawEnabled={false} />}
    </Layer>
  );
});
