/**
 * Labels and category scales shared by the agreement coefficients (lib/agreement.ts).
 *
 * A label is a grade ("A", "B", "C", "Reject") or a number. `categories`, when given, is the full
 * scale in its order (worst last for grades); every label must be one of them, and categories
 * nobody used still count where the coefficient depends on the scale (weighted kappa's distances,
 * AC1's number of categories). Without `categories`, the scale is the labels observed: numbers in
 * ascending order; strings only where order does not matter (unweighted kappa, nominal alpha).
 * 1 and "1" are different labels.
 */

export type Label = string | number;
export type LabelPair = readonly [Label, Label];

export type Scale = {
  categories: Label[];
  /** Position of a label on the scale; throws for a label that is not on it. */
  indexOf: (label: Label) => number;
};

function checkLabel(label: unknown, where: string): asserts label is Label {
  if (typeof label === "string") return;
  if (typeof label === "number" && Number.isFinite(label)) return;
  throw new RangeError(`${where}: a label must be a string or a finite number, got ${String(label)}.`);
}

/**
 * The scale for `labels`: the given categories (checked: non-empty, no duplicates) or the
 * observed labels. `ordered` means the coefficient needs the labels' order.
 */
export function resolveScale(labels: Iterable<Label>, categories: readonly Label[] | undefined, ordered: boolean, what: string): Scale {
  let scale: Label[];
  if (categories !== undefined) {
    if (categories.length === 0) throw new RangeError(`${what}: categories must not be empty.`);
    categories.forEach((category, index) => checkLabel(category, `${what}: categories[${index}]`));
    if (new Set(categories).size !== categories.length) throw new RangeError(`${what}: categories must not repeat a label.`);
    scale = [...categories];
  } else {
    const seen = new Set<Label>();
    for (const label of labels) {
      checkLabel(label, what);
      seen.add(label);
    }
    scale = [...seen];
    if (ordered) {
      if (scale.some((label) => typeof label !== "number")) {
        throw new RangeError(`${what}: text labels have no order of their own; pass categories (e.g. ["A", "B", "C", "Reject"]).`);
      }
      scale.sort((x, y) => (x as number) - (y as number));
    }
  }
  const positions = new Map<Label, number>(scale.map((label, index) => [label, index]));
  return {
    categories: scale,
    indexOf: (label) => {
      const index = positions.get(label);
      if (index === undefined) {
        checkLabel(label, what);
        throw new RangeError(`${what}: label ${JSON.stringify(label)} is not one of the categories ${scale.map((c) => JSON.stringify(c)).join(", ")}.`);
      }
      return index;
    },
  };
}

/**
 * Two-rater contingency table on a scale: table[i][j] counts the pairs whose first label is
 * category i and second is category j.
 */
export function contingencyTable(pairs: readonly LabelPair[], scale: Scale): number[][] {
  const size = scale.categories.length;
  const table = Array.from({ length: size }, () => new Array<number>(size).fill(0));
  for (const [first, second] of pairs) table[scale.indexOf(first)][scale.indexOf(second)]++;
  return table;
}

export function checkPairs(pairs: readonly LabelPair[], what: string): void {
  if (!Array.isArray(pairs)) throw new TypeError(`${what}: pairs must be an array of [first, second] labels.`);
  pairs.forEach((pair, index) => {
    if (!Array.isArray(pair) || pair.length !== 2) throw new TypeError(`${what}: pairs[${index}] must be [first, second].`);
  });
}

/** Row sums, column sums and the total of a square table of counts (checked). */
export function margins(table: readonly (readonly number[])[], what: string): { rows: number[]; columns: number[]; total: number } {
  const size = table.length;
  if (size === 0) throw new RangeError(`${what}: the table must have at least one category.`);
  const rows = new Array<number>(size).fill(0);
  const columns = new Array<number>(size).fill(0);
  table.forEach((row, i) => {
    if (row.length !== size) throw new RangeError(`${what}: the table must be square (row ${i} has ${row.length} cells, expected ${size}).`);
    row.forEach((count, j) => {
      if (!Number.isFinite(count) || count < 0) throw new RangeError(`${what}: cell [${i}][${j}] must be a count >= 0, got ${count}.`);
      rows[i] += count;
      columns[j] += count;
    });
  });
  return { rows, columns, total: rows.reduce((sum, value) => sum + value, 0) };
}
