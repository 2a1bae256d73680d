/**
 * Separate defects of a class: regions are merged when their masks share at least one pixel,
 * directly or through a chain (union–find); regions with an empty mask belong to no group, and
 * masks that only touch (adjacent pixels, no shared pixel) stay apart.
 *
 * One sweep over the rows instead of testing every pair of regions: on each row, the spans of the
 * regions active there are sorted by start, and a span that starts before the furthest end seen
 * so far in its run overlaps the span that reached that end, so the two regions merge. Cost:
 * the regions' rows plus sorting each row's spans, i.e. O(S log S) for S spans — a pair test
 * costs O(n²) row walks when many regions have overlapping boxes but no shared pixel.
 */
import type { SpanSet } from "./spans";

const SLOTS = 16_777_216;

/** The number of separate defects (overlappingGroups' count). */
export function countSeparateRegions(masks: SpanSet[], check: () => void = () => {}): number {
  return overlappingGroups(masks, check).length;
}

/** Groups of mask indices sharing pixels, in order of their first member; `check` runs per span visited. */
export function overlappingGroups(masks: SpanSet[], check: () => void = () => {}): number[][] {
  const present = masks.map((_, index) => index).filter((index) => masks[index].offsets[masks[index].rowCount] > 0);
  if (present.length <= 1) return present.map((index) => [index]);
  const parent = new Int32Array(masks.length).map((_, index) => index);
  const find = (index: number): number => {
    while (parent[index] !== index) {
      parent[index] = parent[parent[index]];
      index = parent[index];
    }
    return index;
  };
  const union = (a: number, b: number) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[ra] = rb;
  };

  // Regions enter the active list at their top row and leave after their last row.
  const byTop = [...present].sort((a, b) => masks[a].top - masks[b].top);
  const firstRow = masks[byTop[0]].top;
  const lastRow = Math.max(...present.map((index) => masks[index].top + masks[index].rowCount));
  let active: number[] = [];
  let next = 0;
  // Scratch for one row: sort keys (start · 2^24 + slot: columns stay below 2^15, a row holds fewer than 2^24 spans) and the spans.
  let keys = new Float64Array(64);
  let ends = new Int32Array(64);
  let owners = new Int32Array(64);
  for (let row = firstRow; row < lastRow; row++) {
    while (next < byTop.length && masks[byTop[next]].top === row) active.push(byTop[next++]);
    if (active.length === 0) {
      if (next < byTop.length) row = masks[byTop[next]].top - 1;
      continue;
    }
    let count = 0;
    for (const index of active) {
      const mask = masks[index];
      const k = row - mask.top;
      for (let i = mask.offsets[k]; i < mask.offsets[k + 1]; i += 2) {
        if (count === keys.length) {
          keys = grow(keys);
          ends = grow(ends);
          owners = grow(owners);
        }
        keys[count] = mask.cols[i] * SLOTS + count;
        ends[count] = mask.cols[i + 1];
        owners[count] = index;
        count++;
        check();
      }
    }
    if (count > 1) {
      const sorted = keys.subarray(0, count).sort();
      let reach = -1;
      let reacher = -1;
      for (let j = 0; j < count; j++) {
        const slot = sorted[j] % SLOTS;
        const start = (sorted[j] - slot) / SLOTS;
        if (start < reach) union(owners[slot], reacher);
        if (ends[slot] > reach) {
          reach = ends[slot];
          reacher = owners[slot];
        }
      }
    }
    active = active.filter((index) => masks[index].top + masks[index].rowCount > row + 1);
  }
  const groups = new Map<number, number[]>();
  for (const index of present) {
    const root = find(index);
    const group = groups.get(root) ?? [];
    group.push(index);
    groups.set(root, group);
  }
  return [...groups.values()];
}

function grow<T extends Float64Array | Int32Array>(array: T): T {
  const grown = new (array.constructor as new (length: number) => T)(array.length * 2);
  grown.set(array);
  return grown;
}
