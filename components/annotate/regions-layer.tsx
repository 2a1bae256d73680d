"use client";

import type Konva from "konva";
import { memo, useCallback, useEffect, useRef } from "react";
import { Layer, Shape } from "react-konva";
import type { Viewport } from "@/lib/annotate/coords";
import type { Bounds } from "@/lib/geometry/bounds";
import type { RegionId } from "@/lib/annotate/types";
import { layerTransform, nativeContext, paintViewOf } from "./konva-view";
import { paintRegion, type SceneInput } from "./paint-regions";
import { RegionRaster, SETTLE_MS } from "./region-raster";

type RegionsLayerProps = {
  viewport: Viewport;
  /** Everything that can be painted, image px (the photo plus room for halos and labels). */
  content: Bounds;
  scene: SceneInput;
  /** The region being dragged with Select: painted live on top instead of from the cache. */
  draggedId: RegionId | null;
};

/**
 * All regions, zones and the ruler as a single Konva shape. Its sceneFunc depends only on the
 * scene, so panning and zooming change nothing but the layer's transform; the painting goes
 * through a bitmap cache (region-raster.ts) that is copied while the view moves and repainted
 * crisply once it has been still for SETTLE_MS. Hidden classes are skipped, off-screen regions
 * culled, and nothing listens for events (the model hit-tests).
 */
export const RegionsLayer = memo(function RegionsLayer({ viewport, content, scene, draggedId }: RegionsLayerProps) {
  const rasterRef = useRef<RegionRaster | null>(null);
  const shapeRef = useRef<Konva.Shape>(null);
  const lastViewChangeRef = useRef(0);

  // Note when the view moved, and ask for one more draw once it has settled.
  useEffect(() => {
    lastViewChangeRef.current = performance.now();
    const timer = window.setTimeout(() => shapeRef.current?.getLayer()?.batchDraw(), SETTLE_MS + 10);
    return () => window.clearTimeout(timer);
  }, [viewport]);

  const sceneFunc = useCallback(
    (context: Konva.Context, shape: Konva.Shape) => {
      const view = paintViewOf(shape);
      if (!view) return;
      const ctx = nativeContext(context);
      rasterRef.current ??= new RegionRaster();
      const settled = performance.now() - lastViewChangeRef.current >= SETTLE_MS;
      rasterRef.current.draw(ctx, scene, view, view.viewport, view.pixelRatio, draggedId, settled, content);
      const dragged = draggedId === null ? undefined : scene.regions.find((r) => r.id === draggedId);
      if (dragged) paintRegion(ctx, dragged, scene.styles, view);
    },
    [scene, draggedId, content],
  );
  return (
    <Layer listening={false} {...layerTransform(viewport)}>
      <Shape ref={shapeRef} sceneFunc={sceneFunc} listening={false} perfectDrawEnabled={false} />
    </Layer>
  );
});
