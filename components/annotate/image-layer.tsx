"use client";

import { memo } from "react";
import { Image as KonvaImage, Layer, Rect } from "react-konva";
import { imageNodeScale, previewIsMagnified, previewScaleOf, type Size, type Viewport } from "@/lib/annotate/coords";
import { layerTransform } from "./konva-view";

type ImageLayerProps = {
  viewport: Viewport;
  /** The loaded preview bitmap, or null while it loads (a dark frame of the photo's size shows instead). */
  image: HTMLImageElement | null;
  original: Size;
  preview: Size;
};

/**
 * The photo. Drawn inside the image-space layer at original / preview size per axis
 * (imageNodeScale), so a preview pixel covers exactly the original pixels it stands for and
 * regions in original coordinates line up. Past the preview's own resolution smoothing is
 * turned off, so a single dead pixel shows as a sharp square, not a blur.
 */
export const ImageLayer = memo(function ImageLayer({ viewport, image, original, preview }: ImageLayerProps) {
  // The bitmap's real size wins over the prop: that is what is actually drawn.
  const bitmap = image && image.naturalWidth > 0 ? { width: image.naturalWidth, height: image.naturalHeight } : preview;
  const { scaleX, scaleY } = imageNodeScale(bitmap, original);
  const magnified = previewIsMagnified(viewport, previewScaleOf(bitmap, original));
  return (
    <Layer listening={false} imageSmoothingEnabled={!magnified} {...layerTransform(viewport)}>
      <Rect width={original.width} height={original.height} fill="#17302f" listening={false} perfectDrawEnabled={false} />
      {image && <KonvaImage image={image} width={bitmap.width} height={bitmap.height} scaleX={scaleX} scaleY={scaleY} listening={false} perfectDrawEnabled={false} />}
    </Layer>
  );
});
