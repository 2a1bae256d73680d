/**
 * Exact scanline rasteriser. Pixel rule: pixel (i, j) is covered when its centre (i + ½, j + ½)
 * lies in the shape, with half-open ties — a centre exactly on a left or top boundary is in, on a
 * right or bottom boundary is out (so shapes that share an edge never share a pixel, and a
 * rectangle with corners on pixel corners covers exactly width × height pixels). Polygons use
 * the nonzero winding rule (SVG's default). Lines are the Minkowski sum of the polyline with a
 * disc of diameter `width` (round joins, round caps). Only rows and columns inside the image are
 * produced. Arithmetic is double precision; no curve is flattened.
 */
import type { Point, Shape } from "@/lib/geometry/shape";
import { lineSegments } from "@/lib/imaging/raster/shape-geometry";
import { emptySpanSet, LooseSpans, SpanWriter, type SpanSet } from "@/lib/imaging/raster/spans";

type Frame = { width: number; height: number };

/** Rows j whose centre j + ½ lies in [y0, y1), clipped to the image. */
function rowRange(y0: number, y1: number, frame: Frame): [number, number] {
  return [Math.max(0, Math.ceil(y0 - 0.5)), Math.min(frame.height, Math.ceil(y1 - 0.5))];
}

/** Columns whose centre lies in [x0, x1), clipped to the image. */
const firstColumn = (x0: number) => Math.max(0, Math.ceil(x0 - 0.5));
const endColumn = (x1: number, frame: Frame) => Math.min(frame.width, Math.ceil(x1 - 0.5));

/** `check` is called once per row written (a deadline check, see lib/imaging/deadline.ts). */
export function shapeSpans(shape: Shape, frame: Frame, check: () => void = () => {}): SpanSet {
  switch (shape.kind) {
    case "rect":
      return rectSpans(shape.x, shape.y, shape.width, shape.height, frame, check);
    case "spot":
      return discSpans(shape.x, shape.y, shape.radius, frame, check);
    case "polygon":
      return polygonSpans(shape.points, frame, check);
    case "line":
      return lineSpans(shape.points, shape.width / 2, frame, check);
  }
}

function rectSpans(x: number, y: number, width: number, height: number, frame: Frame, check: () => void): SpanSet {
  const [first, end] = rowRange(y, y + height, frame);
  const start = firstColumn(x);
  const stop = endColumn(x + width, frame);
  const writer = new SpanWriter();
  for (let j = first; j < end; j++) {
    check();
    writer.push(j, start, stop);
  }
  return writer.finish();
}

function discSpans(cx: number, cy: number, radius: number, frame: Frame, check: () => void): SpanSet {
  const [first, end] = rowRange(cy - radius, cy + radius, frame);
  const writer = new SpanWriter();
  for (let j = first; j < end; j++) {
    check();
    const dy = j + 0.5 - cy;
    const halfChord2 = radius * radius - dy * dy;
    if (halfChord2 <= 0) continue;
    const halfChord = Math.sqrt(halfChord2);
    writer.push(j, firstColumn(cx - halfChord), endColumn(cx + halfChord, frame));
  }
  return writer.finish();
}

function polygonSpans(points: Point[], frame: Frame, check: () => void): SpanSet {
  let minY = Infinity;
  let maxY = -Infinity;
  for (const [, y] of points) {
    minY = Math.min(minY, y);
    maxY = Math.max(maxY, y);
  }
  const [first, end] = rowRange(minY, maxY, frame);
  if (first >= end) return emptySpanSet();
  // An edge owns the rows whose centre is in [yLow, yHigh). Two passes fill packed per-row
  // crossing lists: count, then place (x and winding direction).
  const edgeRows = (k: number): [number, number] => {
    const y1 = points[k][1];
    const y2 = points[(k + 1) % points.length][1];
    const [from, to] = rowRange(Math.min(y1, y2), Math.max(y1, y2), frame);
    return [Math.max(from, first), Math.min(to, end)];
  };
  const rowStarts = new Int32Array(end - first + 1);
  for (let k = 0; k < points.length; k++) {
    const [from, to] = edgeRows(k);
    for (let j = from; j < to; j++) rowStarts[j - first + 1]++;
  }
  for (let k = 1; k < rowStarts.length; k++) rowStarts[k] += rowStarts[k - 1];
  const fill = rowStarts.slice(0, -1);
  const xs = new Float64Array(rowStarts[rowStarts.length - 1]);
  const directions = new Int8Array(xs.length);
  for (let k = 0; k < points.length; k++) {
    const [x1, y1] = points[k];
    const [x2, y2] = points[(k + 1) % points.length];
    if (y1 === y2) continue;
    const [from, to] = edgeRows(k);
    const slope = (x2 - x1) / (y2 - y1);
    const direction = y2 > y1 ? 1 : -1;
    for (let j = from; j < to; j++) {
      check();
      const slot = fill[j - first]++;
      xs[slot] = x1 + (j + 0.5 - y1) * slope;
      directions[slot] = direction;
    }
  }
  const writer = new SpanWriter();
  for (let j = first; j < end; j++) {
    check();
    windingRow(j, xs, directions, rowStarts[j - first], rowStarts[j - first + 1], frame, writer);
  }
  return writer.finish();
}

/** Above this many crossings in a row, insertion sort (quadratic) gives way to typed-array sorts. */
const INSERTION_SORT_MAX = 32;
let ups = new Float64Array(64);
let downs = new Float64Array(64);

/**
 * Sorts one row's crossings and sweeps nonzero winding. Rows usually hold a handful of crossings
 * (insertion sort, in place); a row crossed by many edges in an unlucky order (a zigzag outline)
 * sorts its upward and downward crossings separately and merges them, so a row never costs more
 * than k log k for k crossings.
 */
function windingRow(row: number, xs: Float64Array, directions: Int8Array, from: number, to: number, frame: Frame, writer: SpanWriter): void {
  if (to - from > INSERTION_SORT_MAX) return windingRowSorted(row, xs, directions, from, to, frame, writer);
  for (let i = from + 1; i < to; i++) {
    const x = xs[i];
    const direction = directions[i];
    let k = i - 1;
    while (k >= from && xs[k] > x) {
      xs[k + 1] = xs[k];
      directions[k + 1] = directions[k];
      k--;
    }
    xs[k + 1] = x;
    directions[k + 1] = direction;
  }
  let winding = 0;
  let start = 0;
  for (let i = from; i < to; i++) {
    const before = winding;
    winding += directions[i];
    if (before === 0 && winding !== 0) start = xs[i];
    else if (before !== 0 && winding === 0) writer.push(row, firstColumn(start), endColumn(xs[i], frame));
  }
}

function windingRowSorted(row: number, xs: Float64Array, directions: Int8Array, from: number, to: number, frame: Frame, writer: SpanWriter): void {
  if (ups.length < to - from) {
    ups = new Float64Array(2 * (to - from));
    downs = new Float64Array(2 * (to - from));
  }
  let upCount = 0;
  let downCount = 0;
  for (let i = from; i < to; i++) {
    if (directions[i] > 0) ups[upCount++] = xs[i];
    else downs[downCount++] = xs[i];
  }
  const up = ups.subarray(0, upCount).sort();
  const down = downs.subarray(0, downCount).sort();
  let winding = 0;
  let start = 0;
  for (let u = 0, d = 0; u < upCount || d < downCount;) {
    // Ties take the upward crossing first, as the insertion sort's stable order may not: either
    // order yields the same covered pixels, since a zero-length run covers none.
    const takeUp = d >= downCount || (u < upCount && up[u] <= down[d]);
    const x = takeUp ? up[u++] : down[d++];
    const before = winding;
    winding += takeUp ? 1 : -1;
    if (before === 0 && winding !== 0) start = x;
    else if (before !== 0 && winding === 0) writer.push(row, firstColumn(start), endColumn(x, frame));
  }
}

function lineSpans(points: Point[], halfWidth: number, frame: Frame, check: () => void): SpanSet {
  const loose = new LooseSpans();
  const section = new Float64Array(2);
  for (const [a, b] of lineSegments(points)) {
    const [from, to] = rowRange(Math.min(a[1], b[1]) - halfWidth, Math.max(a[1], b[1]) + halfWidth, frame);
    for (let j = from; j < to; j++) {
      check();
      if (capsuleSection(a, b, halfWidth, j + 0.5, section)) loose.add(j, firstColumn(section[0]), endColumn(section[1], frame));
    }
  }
  return loose.finish();
}

/**
 * Where the horizontal line y = yc cuts the capsule of segment a–b (all points within halfWidth
 * of the segment): writes [low, high] into `out` and returns true, or returns false. The capsule
 * is the union of the two end discs and the band between them, and it is convex, so its section
 * is the hull of the pieces' sections.
 */
export function capsuleSection(a: Point, b: Point, halfWidth: number, yc: number, out: Float64Array): boolean {
  let low = Infinity;
  let high = -Infinity;
  const discA = halfWidth * halfWidth - (yc - a[1]) * (yc - a[1]);
  if (discA >= 0) {
    low = a[0] - Math.sqrt(discA);
    high = a[0] + Math.sqrt(discA);
  }
  const discB = halfWidth * halfWidth - (yc - b[1]) * (yc - b[1]);
  if (discB >= 0) {
    low = Math.min(low, b[0] - Math.sqrt(discB));
    high = Math.max(high, b[0] + Math.sqrt(discB));
  }
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const length = Math.hypot(dx, dy);
  if (length > 0 && dy !== 0) {
    // The band's long sides are the centre line shifted by ±(normal × halfWidth); where y = yc
    // meets them within the segment's extent, they bound the section.
    const nx = (-dy / length) * halfWidth;
    const ny = (dx / length) * halfWidth;
    for (const sign of [1, -1]) {
      const t = (yc - (a[1] + sign * ny)) / dy;
      if (t < 0 || t > 1) continue;
      const x = a[0] + sign * nx + t * dx;
      low = Math.min(low, x);
      high = Math.max(high, x);
    }
  } else if (length > 0 && Math.abs(yc - a[1]) <= halfWidth) {
    // Horizontal segment: the band spans the whole segment in x.
    low = Math.min(low, a[0], b[0]);
    high = Math.max(high, a[0], b[0]);
  }
  if (!(low < high)) return false;
  out[0] = low;
  out[1] = high;
  return true;
}
