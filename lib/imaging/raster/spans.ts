/**
 * Run-length masks ("span sets"): for each pixel row, the covered pixels as sorted, disjoint,
 * non-touching half-open column ranges [start, end). Coverage work is done on these instead of
 * full-frame bitmaps, so cost follows the outline and the rows a shape spans, not the photo's
 * pixel count. Storage is packed (two typed arrays per set) because millions of small per-row
 * arrays made garbage collection the main cost.
 */

/**
 * Row `top + k` holds the ranges cols[offsets[k] .. offsets[k + 1]) as [s0, e0, s1, e1, …].
 * `left`/`right` bound all columns (left >= right when the set is empty).
 */
export type SpanSet = {
  top: number;
  rowCount: number;
  offsets: Int32Array;
  cols: Int32Array;
  left: number;
  right: number;
};

/** Rows, columns and widths stay below 2^15 (input validation caps a side at 32767). */
const COLUMN_BASE = 65_536;
const ROW_BASE = 32_768 * COLUMN_BASE;

export function emptySpanSet(): SpanSet {
  return { top: 0, rowCount: 0, offsets: new Int32Array(1), cols: new Int32Array(0), left: 0, right: 0 };
}

/** Builds a span set from ranges appended in row order, left to right within a row. */
export class SpanWriter {
  private cols = new Int32Array(64);
  private length = 0;
  private rowOffsets: number[] = [];
  private top = -1;
  private currentRow = -1;
  private left = Infinity;
  private right = -Infinity;

  push(row: number, start: number, end: number): void {
    if (start >= end) return;
    if (row !== this.currentRow) {
      if (this.top < 0) this.top = row;
      // Rows in between (and this one) start where the columns end now.
      for (let r = this.currentRow < 0 ? row : this.currentRow + 1; r <= row; r++) this.rowOffsets.push(this.length);
      this.currentRow = row;
    } else if (start <= this.cols[this.length - 1]) {
      if (end > this.cols[this.length - 1]) this.cols[this.length - 1] = end;
      this.right = Math.max(this.right, end);
      return;
    }
    if (this.length + 2 > this.cols.length) {
      const grown = new Int32Array(this.cols.length * 2);
      grown.set(this.cols);
      this.cols = grown;
    }
    this.cols[this.length++] = start;
    this.cols[this.length++] = end;
    this.left = Math.min(this.left, start);
    this.right = Math.max(this.right, end);
  }

  finish(): SpanSet {
    if (this.top < 0) return emptySpanSet();
    const offsets = Int32Array.from([...this.rowOffsets, this.length]);
    return { top: this.top, rowCount: this.rowOffsets.length, offsets, cols: this.cols.slice(0, this.length), left: this.left, right: this.right };
  }
}

/** Collects ranges in any order, overlapping or touching; `finish` sorts and merges them. */
export class LooseSpans {
  private keys = new Float64Array(64);
  private length = 0;

  add(row: number, start: number, end: number): void {
    if (start >= end) return;
    if (this.length === this.keys.length) {
      const grown = new Float64Array(this.keys.length * 2);
      grown.set(this.keys);
      this.keys = grown;
    }
    // One exact double per range sorts by row, then start, then end.
    this.keys[this.length++] = row * ROW_BASE + start * COLUMN_BASE + end;
  }

  addSet(set: SpanSet): void {
    for (let k = 0; k < set.rowCount; k++) {
      for (let i = set.offsets[k]; i < set.offsets[k + 1]; i += 2) this.add(set.top + k, set.cols[i], set.cols[i + 1]);
    }
  }

  finish(): SpanSet {
    const keys = this.keys.subarray(0, this.length).sort();
    const writer = new SpanWriter();
    for (const key of keys) {
      const row = Math.floor(key / ROW_BASE);
      const rest = key - row * ROW_BASE;
      const start = Math.floor(rest / COLUMN_BASE);
      writer.push(row, start, rest - start * COLUMN_BASE);
    }
    return writer.finish();
  }
}

export function countSpans(set: SpanSet): number {
  let total = 0;
  for (let i = 0; i < set.offsets[set.rowCount]; i += 2) total += set.cols[i + 1] - set.cols[i];
  return total;
}

export const isEmptySpanSet = (set: SpanSet): boolean => set.offsets[set.rowCount] === 0;

/** Calls `visit(row, aFrom, aTo, bFrom, bTo)` for each row both sets have (index ranges into cols). */
function sharedRows(a: SpanSet, b: SpanSet, visit: (row: number, aFrom: number, aTo: number, bFrom: number, bTo: number) => boolean | void): void {
  if (a.left >= b.right || b.left >= a.right) return;
  const top = Math.max(a.top, b.top);
  const bottom = Math.min(a.top + a.rowCount, b.top + b.rowCount);
  for (let row = top; row < bottom; row++) {
    const ka = row - a.top;
    const kb = row - b.top;
    if (visit(row, a.offsets[ka], a.offsets[ka + 1], b.offsets[kb], b.offsets[kb + 1]) === true) return;
  }
}

export function intersectSpanSets(a: SpanSet, b: SpanSet): SpanSet {
  const writer = new SpanWriter();
  sharedRows(a, b, (row, i0, i1, j0, j1) => {
    let i = i0;
    let j = j0;
    while (i < i1 && j < j1) {
      const start = Math.max(a.cols[i], b.cols[j]);
      const end = Math.min(a.cols[i + 1], b.cols[j + 1]);
      if (start < end) writer.push(row, start, end);
      if (a.cols[i + 1] < b.cols[j + 1]) i += 2;
      else j += 2;
    }
  });
  return writer.finish();
}

/** Pixel count of a ∩ b without building it. */
export function countIntersection(a: SpanSet, b: SpanSet): number {
  let total = 0;
  sharedRows(a, b, (_row, i0, i1, j0, j1) => {
    let i = i0;
    let j = j0;
    while (i < i1 && j < j1) {
      const start = Math.max(a.cols[i], b.cols[j]);
      const end = Math.min(a.cols[i + 1], b.cols[j + 1]);
      if (start < end) total += end - start;
      if (a.cols[i + 1] < b.cols[j + 1]) i += 2;
      else j += 2;
    }
  });
  return total;
}

export function spanSetsOverlap(a: SpanSet, b: SpanSet): boolean {
  let found = false;
  sharedRows(a, b, (_row, i0, i1, j0, j1) => {
    let i = i0;
    let j = j0;
    while (i < i1 && j < j1) {
      if (Math.max(a.cols[i], b.cols[j]) < Math.min(a.cols[i + 1], b.cols[j + 1])) return (found = true);
      if (a.cols[i + 1] < b.cols[j + 1]) i += 2;
      else j += 2;
    }
  });
  return found;
}

export function unionSpanSets(sets: SpanSet[]): SpanSet {
  const present = sets.filter((set) => !isEmptySpanSet(set));
  if (present.length === 0) return emptySpanSet();
  if (present.length === 1) return present[0];
  const loose = new LooseSpans();
  for (const set of present) loose.addSet(set);
  return loose.finish();
}

/** Every pixel of a width × height image. */
export function fullFrameSpanSet(width: number, height: number): SpanSet {
  const writer = new SpanWriter();
  for (let row = 0; row < height; row++) writer.push(row, 0, width);
  return writer.finish();
}

/** The ranges of row `row` as [s0, e0, …] (a copy; for tests and debugging). */
export function spanRow(set: SpanSet, row: number): number[] {
  const k = row - set.top;
  if (k < 0 || k >= set.rowCount) return [];
  return Array.from(set.cols.subarray(set.offsets[k], set.offsets[k + 1]));
}
