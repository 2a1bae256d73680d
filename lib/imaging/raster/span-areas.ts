/**
 * Span sets (spans.ts) as areas to show: the difference of two sets (what one person marked and
 * the other did not), and a set as a list of rectangles a canvas or an SVG can draw.
 *
 * Rectangles: runs of the same columns on consecutive rows become one rectangle, so an axis-
 * aligned box is one rectangle and a diagonal stroke about one per row. Coordinates are the
 * photo's upright pixels, like the regions themselves: rectangle {x, y, width, height} covers
 * columns x … x+width−1 of rows y … y+height−1, exactly the set's pixels (no pixel twice).
 */
import { SpanWriter, type SpanSet } from "./spans";

export type PixelRect = { x: number; y: number; width: number; height: number };

/** The pixels of `a` that are not in `b`. */
export function subtractSpanSets(a: SpanSet, b: SpanSet): SpanSet {
  const writer = new SpanWriter();
  for (let k = 0; k < a.rowCount; k++) {
    const row = a.top + k;
    const kb = row - b.top;
    let j = kb >= 0 && kb < b.rowCount ? b.offsets[kb] : 0;
    const jEnd = kb >= 0 && kb < b.rowCount ? b.offsets[kb + 1] : 0;
    for (let i = a.offsets[k]; i < a.offsets[k + 1]; i += 2) {
      let start = a.cols[i];
      const end = a.cols[i + 1];
      // Skip b's ranges that end before this range starts; cut out the ones inside it.
      while (j < jEnd && b.cols[j + 1] <= start) j += 2;
      let cut = j;
      while (cut < jEnd && b.cols[cut] < end) {
        if (b.cols[cut] > start) writer.push(row, start, b.cols[cut]);
        start = Math.max(start, b.cols[cut + 1]);
        if (b.cols[cut + 1] >= end) break;
        cut += 2;
      }
      if (start < end) writer.push(row, start, end);
    }
  }
  return writer.finish();
}

/** The set as rectangles, in row order (see the file head). */
export function spanRects(set: SpanSet): PixelRect[] {
  const rects: PixelRect[] = [];
  // Rectangles still growing, keyed by their column range (start * 2^16 + end; columns < 2^15).
  let open = new Map<number, PixelRect>();
  for (let k = 0; k < set.rowCount; k++) {
    const row = set.top + k;
    const next = new Map<number, PixelRect>();
    for (let i = set.offsets[k]; i < set.offsets[k + 1]; i += 2) {
      const key = set.cols[i] * 65_536 + set.cols[i + 1];
      const growing = open.get(key);
      if (growing) {
        growing.height++;
        next.set(key, growing);
      } else {
        const rect = { x: set.cols[i], y: row, width: set.cols[i + 1] - set.cols[i], height: 1 };
        rects.push(rect);
        next.set(key, rect);
      }
    }
    open = next;
  }
  return rects;
}
