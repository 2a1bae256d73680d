/**
 * The glue between the viewport and Konva: every layer carries the viewport as its own transform
 * (so panning changes three numbers per layer, not a thousand nodes), and a sceneFunc reads the
 * view back from its layer, which keeps the sceneFunc itself independent of pan and zoom.
 */
import type Konva from "konva";
import { visibleImageBounds, type Viewport } from "@/lib/annotate/coords";
import type { PaintView } from "./paint-regions";

export type LayerTransform = { x: number; y: number; scaleX: number; scaleY: number };

export function layerTransform(viewport: Viewport): LayerTransform {
  return { x: viewport.offsetX, y: viewport.offsetY, scaleX: viewport.scale, scaleY: viewport.scale };
}

export type ShapeView = PaintView & { viewport: Viewport; pixelRatio: number };

/** The view a shape is painted in, from its layer's transform, the stage size and the canvas's pixel ratio. */
export function paintViewOf(shape: Konva.Shape): ShapeView | null {
  const layer = shape.getLayer();
  const stage = shape.getStage();
  if (!layer || !stage) return null;
  const viewport: Viewport = { scale: layer.scaleX(), offsetX: layer.x(), offsetY: layer.y() };
  const visible = visibleImageBounds(viewport, { width: stage.width(), height: stage.height() });
  return { scale: viewport.scale, visible, viewport, pixelRatio: layer.getCanvas().getPixelRatio() };
}

/** The browser's 2D context behind Konva's wrapper (Konva documents `_context` for this use). */
export function nativeContext(context: Konva.Context): CanvasRenderingContext2D {
  return context._context;
}
