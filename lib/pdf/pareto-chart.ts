/**
 * Draws a Pareto chart from paretoGeometry() (lib/reports/pareto-geometry.ts): bars of counts,
 * the cumulative share as a line with points, a dashed line at the cut-off, both axes labelled.
 * The vital few (classes up to the cut-off) are filled darker; the data table beside the chart
 * carries the exact numbers.
 */
import { paretoGeometry } from "@/lib/reports/pareto-geometry";
import type { ParetoRow } from "@/lib/reports/pareto";
import type { PdfDoc } from "./document";
import { PDF_FONT } from "./fonts";

const BAR_VITAL = "#2F5D8A";
const BAR_OTHER = "#9DB4CC";
const LINE = "#B5482A";
const AXIS = "#555555";

export function drawParetoChart(doc: PdfDoc, rows: readonly ParetoRow[], box: { x: number; y: number; width: number; height: number }): void {
  const g = paretoGeometry(rows, { width: box.width, height: box.height, margin: { top: 18, right: 34, bottom: 34, left: 30 } });
  doc.save();
  doc.translate(box.x, box.y);
  const { plot } = g;
  doc.font(PDF_FONT.regular).fontSize(6.5).fillColor(AXIS);

  for (const tick of g.countTicks) {
    doc
      .moveTo(plot.x, tick.y)
      .lineTo(plot.x + plot.width, tick.y)
      .lineWidth(0.3)
      .strokeColor("#DDDDDD")
      .stroke();
    doc.fillColor(AXIS).text(String(tick.value), 0, tick.y - 3.5, { width: plot.x - 4, align: "right", lineBreak: false });
  }
  for (const tick of g.shareTicks) {
    doc.fillColor(AXIS).text(`${Math.round(tick.value * 100)} %`, plot.x + plot.width + 4, tick.y - 3.5, { width: 30, lineBreak: false });
  }
  for (const bar of g.bars) {
    doc.rect(bar.x, bar.y, bar.width, bar.height).fill(bar.vitalFew ? BAR_VITAL : BAR_OTHER);
    doc.fillColor("#111111").text(bar.label, bar.x - 2, plot.y + plot.height + 4, { width: bar.width + 4, align: "center", height: 26, ellipsis: true });
  }
  if (g.cutoff) {
    doc
      .moveTo(plot.x, g.cutoff.y)
      .lineTo(plot.x + plot.width, g.cutoff.y)
      .lineWidth(0.6)
      .dash(3, { space: 2 })
      .strokeColor(LINE)
      .stroke()
      .undash();
  }
  if (g.line.length) {
    doc.moveTo(g.line[0].x, g.line[0].y);
    for (const point of g.line.slice(1)) doc.lineTo(point.x, point.y);
    doc.lineWidth(1.2).strokeColor(LINE).stroke();
    for (const point of g.line) doc.circle(point.x, point.y, 1.8).fill(LINE);
  }
  doc
    .moveTo(plot.x, plot.y)
    .lineTo(plot.x, plot.y + plot.height)
    .lineTo(plot.x + plot.width, plot.y + plot.height)
    .lineTo(plot.x + plot.width, plot.y)
    .lineWidth(0.6)
    .strokeColor(AXIS)
    .stroke();
  doc
    .fontSize(6.5)
    .fillColor(AXIS)
    .text("Defects", 0, plot.y - 14, { width: plot.x + 30, lineBreak: false });
  doc.fillColor(LINE).text("Cumulative share", plot.x + plot.width - 60, plot.y - 14, { width: 92, align: "right", lineBreak: false });
  doc.restore();
}
