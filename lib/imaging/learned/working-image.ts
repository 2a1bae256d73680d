/**
 * The working copy learned suggestions look at: the upright photo (Exif orientation applied),
 * resized so its long side is `workingSide` px, as raw sRGB. Training and suggesting use the same
 * size (it is stored in the model), so a defect spans the same number of working pixels whether
 * the caller hands in a 12 MP original or its 2 560 px preview. Shapes move between the caller's
 * pixels and working pixels per axis, like the preview mapping in lib/regions/suggestion-mapping.ts.
 */
import sharp from "sharp";
import type { Point, Shape } from "@/lib/geometry/shape";
import { imagingError } from "@/lib/imaging/otsu";

export type WorkingImage = {
  /** Raw RGB, 3 bytes per pixel, row-major. */
  rgb: Uint8Array;
  width: number;
  height: number;
  /** The upright image the caller handed in. */
  original: { width: number; height: number };
};

/** 12 MP originals are the normal case; this also refuses decompression bombs before decoding. */
const LIMIT_INPUT_PIXELS = 100_000_000;

export async function loadWorkingImage(input: Buffer, workingSide: number): Promise<WorkingImage> {
  try {
    const meta = await sharp(input, { limitInputPixels: LIMIT_INPUT_PIXELS }).metadata();
    const original = { width: meta.autoOrient?.width ?? meta.width ?? 0, height: meta.autoOrient?.height ?? meta.height ?? 0 };
    const { data, info } = await sharp(input, { limitInputPixels: LIMIT_INPUT_PIXELS, autoOrient: true })
      // Smaller photos are enlarged too: a mark must span the same working pixels at any photo size.
      .resize({ width: workingSide, height: workingSide, fit: "inside" })
      .removeAlpha()
      .toColourspace("srgb")
      .raw()
      .toBuffer({ resolveWithObject: true });
    if (info.channels !== 3) throw new Error(`expected 3 channels, got ${info.channels}`);
    return { rgb: new Uint8Array(data.buffer, data.byteOffset, data.length), width: info.width, height: info.height, original };
  } catch (error) {
    throw imagingError(error);
  }
}

const scalePoint = ([x, y]: Point, sx: number, sy: number): Point => [x * sx, y * sy];

/** A shape scaled per axis; a Line's width and a Spot's radius by the mean of the two factors. */
export function scaleShape(shape: Shape, sx: number, sy: number): Shape {
  const mean = (sx + sy) / 2;
  switch (shape.kind) {
    case "rect":
      return { kind: "rect", x: shape.x * sx, y: shape.y * sy, width: shape.width * sx, height: shape.height * sy };
    case "polygon":
      return { kind: "polygon", points: shape.points.map((p) => scalePoint(p, sx, sy)) };
    case "line":
      return { kind: "line", points: shape.points.map((p) => scalePoint(p, sx, sy)), width: shape.width * mean };
    case "spot":
      return { kind: "spot", x: shape.x * sx, y: shape.y * sy, radius: shape.radius * mean };
  }
}

/** Factors from the caller's pixels to working pixels. */
export function toWorking(image: WorkingImage): [number, number] {
  return [image.width / image.original.width, image.height / image.original.height];
}
