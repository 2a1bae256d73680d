/**
 * Where a Pareto chart's marks go, computed with d3-scale from the rows of pareto.ts, so a PDF
 * (pdfkit draws these numbers) shows the same chart as the screen (recharts renders nothing on
 * the server). Pure; coordinates in the caller's units with y growing downwards.
 *
 * Layout: bars on a band scale (padding 0.2) against a count axis starting at 0 and rounded up
 * with d3's `nice()`; the cumulative line joins the bar centres against a 0–100 % axis on the
 * right; a dashed reference line at the cut-off share.
 */
import { scaleBand, scaleLinear } from "d3-scale";
import type { ParetoRow } from "./pareto";

export type Box = { x: number; y: number; width: number; height: number };
export type ParetoGeometry = {
  plot: Box;
  bars: { key: string; label: string; count: number; x: number; y: number; width: number; height: number; centerX: number; vitalFew: boolean }[];
  line: { x: number; y: number; cumulativeShare: number }[];
  countTicks: { value: number; y: number }[];
  shareTicks: { value: number; y: number }[];
  cutoff: { value: number; y: number } | null;
};

export type ParetoLayout = { width: number; height: number; margin?: { top: number; right: number; bottom: number; left: number }; cutoff?: number | null };

const DEFAULT_MARGIN = { top: 12, right: 40, bottom: 48, left: 40 };

/**
 * The count axis of a Pareto chart, for the PDF and the screen alike: from 0 to `maxCount` rounded
 * up with d3's `nice()` (about five ticks), whole numbers only. One defect gives 0–1, not 0–4.
 */
export function countAxis(maxCount: number): { max: number; ticks: number[] } {
  const scale = scaleLinear()
    .domain([0, Math.max(1, maxCount)])
    .nice(5);
  return { max: scale.domain()[1], ticks: scale.ticks(5).filter((value) => Number.isInteger(value)) };
}

export function paretoGeometry(rows: readonly ParetoRow[], layout: ParetoLayout): ParetoGeometry {
  const margin = layout.margin ?? DEFAULT_MARGIN;
  const plot = { x: margin.left, y: margin.top, width: layout.width - margin.left - margin.right, height: layout.height - margin.top - margin.bottom };
  if (!(plot.width > 0 && plot.height > 0)) throw new RangeError("The chart is too small for its margins");

  const x = scaleBand<string>()
    .domain(rows.map((row) => row.key))
    .range([plot.x, plot.x + plot.width])
    .padding(0.2);
  const axis = countAxis(Math.max(0, ...rows.map((row) => row.count)));
  const counts = scaleLinear()
    .domain([0, axis.max])
    .range([plot.y + plot.height, plot.y]);
  const shares = scaleLinear()
    .domain([0, 1])
    .range([plot.y + plot.height, plot.y]);

  const bars = rows.map((row) => {
    const left = x(row.key) ?? plot.x;
    const top = counts(row.count);
    return {
      key: row.key,
      label: row.label,
      count: row.count,
      x: left,
      y: top,
      width: x.bandwidth(),
      height: plot.y + plot.height - top,
      centerX: left + x.bandwidth() / 2,
      vitalFew: row.vitalFew,
    };
  });
  const cutoffValue = layout.cutoff === undefined ? 0.8 : layout.cutoff;
  return {
    plot,
    bars,
    line: rows.map((row, i) => ({ x: bars[i].centerX, y: shares(row.cumulativeShare), cumulativeShare: row.cumulativeShare })),
    // Whole counts only: a fractional tick on a count axis reads as nonsense.
    countTicks: axis.ticks.map((value) => ({ value, y: counts(value) })),
    shareTicks: [0, 0.25, 0.5, 0.75, 1].map((value) => ({ value, y: shares(value) })),
    cutoff: cutoffValue === null ? null : { value: cutoffValue, y: shares(cutoffValue) },
  };
}
