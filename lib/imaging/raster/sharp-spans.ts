/**
 * Rasterises region shapes with sharp (librsvg + cairo) into span sets, measuring only where the
 * shapes are: every shape gets a tile the size of its pixel box (long lines are cut into short
 * pieces first, so a diagonal scratch does not need a huge square box), the tiles are packed into
 * one SVG atlas per <= 16 MP, rendered with shape-rendering="crispEdges" in one sharp call per
 * atlas, and each tile's rows are run-length encoded back into image coordinates.
 *
 * librsvg's cost grows with the number of SVG elements, so an atlas holds one fill <path> for
 * all rects, polygons and spots, one stroke <path> per line region, and a clipping viewport only
 * for the few pieces the image border cuts. Tiles are padded by 2 px so shapes in neighbouring
 * tiles stay >= 3 px apart and never interact.
 *
 * Pixel rule (measured against the exact pixel-centre rasteriser in tests/unit/imaging/raster): cairo's
 * non-antialiased fill covers a pixel when its centre lies in the shape, except that coordinates
 * are snapped to 1/256 px, round caps and joins are flattened to within 0.1 px (spots are drawn
 * as equal-area polygons instead, see equalAreaCircle), and where two edges of one shape come
 * within about a pixel of each other along a row (sharp vertices, slivers) the gap between them
 * can be filled. On random polygons the masks differ in well under 0.1 % of the covered pixels;
 * rectangles on pixel corners are exact.
 */
import sharp from "sharp";
import { AppError } from "@/lib/errors";
import type { Point, Shape } from "@/lib/geometry/shape";
import { lineSegments, shapeBounds, splitSegments, type Bounds } from "@/lib/imaging/raster/shape-geometry";
import { LooseSpans, type SpanSet } from "@/lib/imaging/raster/spans";

type Frame = { width: number; height: number };

/** What one tile draws: a filled shape, or one round-capped piece of a line. */
type Geometry = Exclude<Shape, { kind: "line" }> | { kind: "stroke"; a: Point; b: Point; width: number };
/** A tile: the shape it belongs to, its pixel box (half-open, in the image) and whether the image border cuts it. */
type Piece = { owner: number; geometry: Geometry; left: number; top: number; right: number; bottom: number; cut: boolean };
type Placed = Piece & { atlasX: number; atlasY: number };
type Atlas = { width: number; height: number; pieces: Placed[] };

/** Line pieces at most this long keep tiles small (about (32 + width)² pixels each). */
const LINE_PIECE_LENGTH = 32;
const TILE_PAD = 2;
const MIN_ATLAS_WIDTH = 2048;
const MAX_ATLAS_PIXELS = 16_000_000;
/** Cairo surfaces stop at 32767 px a side; stay well below. */
const MAX_ATLAS_HEIGHT = 16_384;

const num = (value: number) => String(value);

function pieceGeometries(shape: Shape): { geometry: Geometry; bounds: Bounds }[] {
  if (shape.kind !== "line") return [{ geometry: shape, bounds: shapeBounds(shape) }];
  const half = shape.width / 2;
  return splitSegments(lineSegments(shape.points), LINE_PIECE_LENGTH).map(([a, b]) => ({
    geometry: { kind: "stroke", a, b, width: shape.width },
    bounds: {
      minX: Math.min(a[0], b[0]) - half,
      minY: Math.min(a[1], b[1]) - half,
      maxX: Math.max(a[0], b[0]) + half,
      maxY: Math.max(a[1], b[1]) + half,
    },
  }));
}

/** SVG path data of a piece, shifted by (dx, dy). */
function pathData(geometry: Geometry, dx: number, dy: number): string {
  const x = (value: number) => num(value + dx);
  const y = (value: number) => num(value + dy);
  switch (geometry.kind) {
    case "rect":
      return `M${x(geometry.x)} ${y(geometry.y)}H${x(geometry.x + geometry.width)}V${y(geometry.y + geometry.height)}H${x(geometry.x)}Z`;
    case "polygon":
      return `M${geometry.points.map(([px, py]) => `${x(px)} ${y(py)}`).join("L")}Z`;
    case "spot":
      return `M${equalAreaCircle(geometry.x, geometry.y, geometry.radius)
        .map(([px, py]) => `${x(px)} ${y(py)}`)
        .join("L")}Z`;
    case "stroke":
      return `M${x(geometry.a[0])} ${y(geometry.a[1])}L${x(geometry.b[0])} ${y(geometry.b[1])}`;
  }
}

/**
 * A disc as a polygon with the disc's exact area, within about 0.01 px of the circle. Drawn as a
 * <circle>, cairo flattens it to an inscribed polyline (0.1 px tolerance) and every spot comes out
 * a little small: about −6 px on average for radii 10–70 px in our measurements.
 */
function equalAreaCircle(cx: number, cy: number, radius: number): Point[] {
  // Inscribed n-gon sagitta r·(1 − cos(π/n)) ≈ r·π²/(2n²) <= 0.02 px; equal area halves the error.
  const sides = Math.min(1024, Math.max(16, Math.ceil(Math.PI * Math.sqrt(radius / 0.04))));
  const step = (2 * Math.PI) / sides;
  const scaled = radius * Math.sqrt(step / Math.sin(step));
  return Array.from({ length: sides }, (_, k) => [cx + scaled * Math.cos(k * step), cy + scaled * Math.sin(k * step)] as Point);
}

const strokeAttributes = (width: number) => `fill="none" stroke="#fff" stroke-width="${num(width)}" stroke-linecap="round" stroke-linejoin="round"`;

function collectPieces(shapes: Shape[], frame: Frame): Piece[] {
  const pieces: Piece[] = [];
  shapes.forEach((shape, owner) => {
    for (const { geometry, bounds } of pieceGeometries(shape)) {
      // Pixels whose centre may be inside, padded so cairo's rounding stays within the tile.
      const left = Math.ceil(bounds.minX - 0.5) - TILE_PAD;
      const top = Math.ceil(bounds.minY - 0.5) - TILE_PAD;
      const right = Math.ceil(bounds.maxX - 0.5) + TILE_PAD;
      const bottom = Math.ceil(bounds.maxY - 0.5) + TILE_PAD;
      const box = { left: Math.max(0, left), top: Math.max(0, top), right: Math.min(frame.width, right), bottom: Math.min(frame.height, bottom) };
      const cut = box.left !== left || box.top !== top || box.right !== right || box.bottom !== bottom;
      if (box.left < box.right && box.top < box.bottom) pieces.push({ owner, geometry, ...box, cut });
    }
  });
  return pieces;
}

/** Shelf packing, tallest first; a new atlas starts when one would grow past its limits. */
function packAtlases(pieces: Piece[]): Atlas[] {
  const sorted = [...pieces].sort((a, b) => b.bottom - b.top - (a.bottom - a.top));
  const atlasWidth = Math.max(MIN_ATLAS_WIDTH, ...sorted.map((piece) => piece.right - piece.left));
  const atlases: Atlas[] = [];
  let current: Atlas | null = null;
  let cursorX = 0;
  let shelfY = 0;
  let shelfHeight = 0;
  for (const piece of sorted) {
    const width = piece.right - piece.left;
    const height = piece.bottom - piece.top;
    if (current && cursorX + width > atlasWidth) {
      shelfY += shelfHeight;
      cursorX = 0;
      shelfHeight = 0;
    }
    const grownHeight = Math.max(shelfY + height, current?.height ?? 0);
    if (!current || grownHeight > MAX_ATLAS_HEIGHT || grownHeight * atlasWidth > MAX_ATLAS_PIXELS) {
      if (!current || current.pieces.length > 0) atlases.push((current = { width: atlasWidth, height: 0, pieces: [] }));
      cursorX = 0;
      shelfY = 0;
      shelfHeight = 0;
    }
    current.pieces.push({ ...piece, atlasX: cursorX, atlasY: shelfY });
    current.height = Math.max(current.height, shelfY + height);
    cursorX += width;
    shelfHeight = Math.max(shelfHeight, height);
  }
  return atlases;
}

function atlasSvg(atlas: Atlas): string {
  const fills: string[] = [];
  const strokesByOwner = new Map<number, { width: number; data: string[] }>();
  const cutTiles: string[] = [];
  for (const piece of atlas.pieces) {
    const { geometry } = piece;
    if (piece.cut) {
      // A nested viewport clips to the tile and maps image coordinates through its viewBox.
      const width = piece.right - piece.left;
      const height = piece.bottom - piece.top;
      const attributes = geometry.kind === "stroke" ? strokeAttributes(geometry.width) : "";
      cutTiles.push(
        `<svg x="${piece.atlasX}" y="${piece.atlasY}" width="${width}" height="${height}" viewBox="${piece.left} ${piece.top} ${width} ${height}"><path d="${pathData(geometry, 0, 0)}" ${attributes}/></svg>`,
      );
      continue;
    }
    const data = pathData(geometry, piece.atlasX - piece.left, piece.atlasY - piece.top);
    if (geometry.kind !== "stroke") fills.push(data);
    else {
      const stroke = strokesByOwner.get(piece.owner) ?? { width: geometry.width, data: [] };
      stroke.data.push(data);
      strokesByOwner.set(piece.owner, stroke);
    }
  }
  const strokes = [...strokesByOwner.values()].map(({ width, data }) => `<path d="${data.join("")}" ${strokeAttributes(width)}/>`);
  const fillPath = fills.length > 0 ? `<path d="${fills.join("")}"/>` : "";
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${atlas.width}" height="${atlas.height}" shape-rendering="crispEdges" fill="#fff">${fillPath}${strokes.join("")}${cutTiles.join("")}</svg>`;
}

async function renderAtlasMask(atlas: Atlas): Promise<Uint8Array> {
  const mask = await sharp(Buffer.from(atlasSvg(atlas)))
    .extractChannel(3)
    .raw()
    .toBuffer();
  if (mask.length !== atlas.width * atlas.height) {
    throw new Error(`sharp returned ${mask.length} bytes for a ${atlas.width}×${atlas.height} mask`);
  }
  return mask;
}

/**
 * Tile pixels one call may render. The tiles, not the photo, are this path's cost: a 4 000 px wide
 * Line across a 12 MP photo is 125 tiles of 16 MP each (two billion pixels, about 16 s). The caps
 * on widths and radii keep real input far below; this refuses whatever still gets through.
 */
export const MAX_TILE_PIXELS = 400_000_000;

/** One span set per input shape (same order), clipped to the image. */
export async function sharpShapeSpans(shapes: Shape[], frame: Frame): Promise<SpanSet[]> {
  const pieces = collectPieces(shapes, frame);
  const tilePixels = pieces.reduce((sum, p) => sum + (p.right - p.left) * (p.bottom - p.top), 0);
  if (tilePixels > MAX_TILE_PIXELS) {
    throw new AppError("bad_request", `These regions need ${Math.round(tilePixels / 1e6)} million tile pixels to rasterise with sharp; at most ${MAX_TILE_PIXELS / 1e6} million are allowed.`);
  }
  const atlases = packAtlases(pieces);
  const masks = await Promise.all(atlases.map(renderAtlasMask));
  const loose = shapes.map(() => new LooseSpans());
  atlases.forEach((atlas, index) => {
    const mask = masks[index];
    for (const piece of atlas.pieces) {
      const width = piece.right - piece.left;
      const target = loose[piece.owner];
      for (let row = 0; row < piece.bottom - piece.top; row++) {
        const base = (piece.atlasY + row) * atlas.width + piece.atlasX;
        let runStart = -1;
        for (let col = 0; col <= width; col++) {
          const covered = col < width && mask[base + col] > 127;
          if (covered && runStart < 0) runStart = col;
          else if (!covered && runStart >= 0) {
            target.add(piece.top + row, piece.left + runStart, piece.left + col);
            runStart = -1;
          }
        }
      }
    }
  });
  return loose.map((spans) => spans.finish());
}
