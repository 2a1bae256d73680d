"use client";

import { Bar, CartesianGrid, ComposedChart, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { ParetoRow } from "@/lib/reports/pareto";
import { countAxis } from "@/lib/reports/pareto-geometry";

/**
 * The Pareto chart of defect classes: bars of defects per class, most frequent first, and the
 * cumulative share as a line on its own 0–100 % axis. The numbers are in the table beside it
 * (screen readers and printing read that; the chart is a picture of it).
 */
export function ParetoChart({ rows, title }: { rows: ParetoRow[]; title: string }) {
  // Whole-number ticks up to a rounded maximum, as the PDF's chart (one defect: 0–1, not 0–4).
  const axis = countAxis(Math.max(0, ...rows.map((r) => r.count)));
  const data = rows.map((r) => ({ label: r.label, count: r.count, cumulative: Math.round(r.cumulativeShare * 1000) / 10 }));
  return (
    <figure className="h-64 w-full" aria-label={title} data-testid="pareto-chart">
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 0 }}>
          <CartesianGrid strokeDasharray="3 3" vertical={false} />
          <XAxis dataKey="label" interval={0} tick={{ fontSize: 11 }} />
          <YAxis
            yAxisId="count"
            allowDecimals={false}
            domain={[0, axis.max]}
            ticks={axis.ticks}
            tick={{ fontSize: 11 }}
            label={{ value: "defects", angle: -90, position: "insideLeft", fontSize: 11 }}
          />
          <YAxis yAxisId="share" orientation="right" domain={[0, 100]} unit=" %" tick={{ fontSize: 11 }} />
          <Tooltip />
          <Bar yAxisId="count" dataKey="count" name="Defects" fill="#3e5c76" isAnimationActive={false} />
          <Line yAxisId="share" dataKey="cumulative" name="Cumulative %" stroke="#c2410c" strokeWidth={2} dot={{ r: 3 }} isAnimationActive={false} />
        </ComposedChart>
      </ResponsiveContainer>
    </figure>
  );
}
