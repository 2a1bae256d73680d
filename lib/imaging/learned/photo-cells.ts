/**
 * One photo made ready for the classifier: its working copy summed into cells, which cells lie
 * inside the Surface, and (for training) its regions as working-pixel masks per class.
 */
import type { Shape } from "@/lib/geometry/shape";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { unionSpanSets, type SpanSet } from "@/lib/imaging/raster/spans";
import { buildCellGrid, type CellGrid, type PixelBox } from "./cell-grid";
import { CONTEXT_RADIUS, featureRows, insideShares } from "./features";
import type { ClassMask } from "./sampling";
import { loadWorkingImage, scaleShape, toWorking, type WorkingImage } from "./working-image";

/** A cell takes part when at least this share of it is inside the Surface. */
export const MIN_INSIDE_SHARE = 0.5;

export type PreparedPhoto = {
  image: Pick<WorkingImage, "width" | "height" | "original">;
  grid: CellGrid;
  /** Share of each cell inside the Surface (1 everywhere when none was given). */
  inside: Float32Array;
  /** 1 for cells that take part (at least MIN_INSIDE_SHARE inside). */
  active: Uint8Array;
  /** Per-axis factors from the caller's pixels to working pixels. */
  scale: [number, number];
};

/** The Surface's box grown by the feature context (CONTEXT_RADIUS cells and one for the box means), cell-aligned. */
function measuredBox(surface: SpanSet, frame: { width: number; height: number }, cellSize: number): PixelBox {
  const margin = (CONTEXT_RADIUS + 1) * cellSize;
  const align = (v: number, limit: number, up: boolean) => Math.max(0, Math.min(limit, (up ? Math.ceil(v / cellSize) : Math.floor(v / cellSize)) * cellSize));
  if (surface.rowCount === 0) return { x0: 0, y0: 0, x1: 0, y1: 0 };
  return {
    x0: align(surface.left - margin, frame.width, false),
    y0: align(surface.top - margin, frame.height, false),
    x1: align(surface.right + margin, frame.width, true),
    y1: align(surface.top + surface.rowCount + margin, frame.height, true),
  };
}

export async function preparePhoto(bytes: Buffer, surface: readonly Shape[] | undefined, workingSide: number, cellSize: number): Promise<PreparedPhoto> {
  const image = await loadWorkingImage(bytes, workingSide);
  const [sx, sy] = toWorking(image);
  const frame = { width: image.width, height: image.height };
  const surfaceSpans = surface && surface.length > 0 ? unionSpanSets(surface.map((shape) => shapeSpans(scaleShape(shape, sx, sy), frame))) : null;
  const grid = buildCellGrid(image, cellSize, surfaceSpans, surfaceSpans ? measuredBox(surfaceSpans, frame, cellSize) : undefined);
  const inside = insideShares(grid);
  const active = Uint8Array.from(inside, (share) => (share >= MIN_INSIDE_SHARE ? 1 : 0));
  return { image: { width: image.width, height: image.height, original: image.original }, grid, inside, active, scale: [sx, sy] };
}

/** Regions of known classes as working-pixel shapes and masks (class index from `classIndex`). */
export function workingRegions(photo: PreparedPhoto, regions: readonly { defect: string; shape: Shape }[], classIndex: ReadonlyMap<string, number>) {
  const frame = { width: photo.image.width, height: photo.image.height };
  const shapes: { defect: string; classIndex: number; shape: Shape }[] = [];
  for (const region of regions) {
    const index = classIndex.get(region.defect);
    if (index === undefined) continue;
    shapes.push({ defect: region.defect, classIndex: index, shape: scaleShape(region.shape, photo.scale[0], photo.scale[1]) });
  }
  const masks: ClassMask[] = shapes.map((s) => ({ classIndex: s.classIndex, spans: shapeSpans(s.shape, frame) }));
  return { shapes, masks };
}

/** Forest scores of every active cell: result[c][cell] for model class c (0 = first defect class). */
export function scoreActiveCells(photo: PreparedPhoto, score: (rows: number[][]) => Float32Array[]): Float32Array[] {
  const cells: number[] = [];
  for (let cell = 0; cell < photo.active.length; cell++) if (photo.active[cell]) cells.push(cell);
  const byRow = score(featureRows(photo.grid, cells));
  // byRow[0] is "no defect"; the defect classes follow.
  return byRow.slice(1).map((rowScores) => {
    const full = new Float32Array(photo.active.length);
    cells.forEach((cell, r) => (full[cell] = rowScores[r]));
    return full;
  });
}
