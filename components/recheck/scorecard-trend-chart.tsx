"use client";
/**
 * The weekly trend of a scorecard: exact agreement and Cohen's kappa per week on one 0–1 axis,
 * over Landis & Koch's bands (shaded and named) and the workspace's drift threshold. The two
 * lines differ by pattern and marker as well as colour (solid with circles, dashed with
 * squares). Weeks without rechecks are gaps, not zeros. The figures are also in the table beside
 * it (ScorecardWeekTable), which screen readers read; the chart itself is a labelled image.
 */
import { CartesianGrid, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export type TrendPoint = { week: string; exact: number | null; kappa: number | null; n: number };

const BANDS: { from: number; to: number; name: string }[] = [
  { from: 0, to: 0.2, name: "slight" },
  { from: 0.2, to: 0.4, name: "fair" },
  { from: 0.4, to: 0.6, name: "moderate" },
  { from: 0.6, to: 0.8, name: "substantial" },
  { from: 0.8, to: 1, name: "almost perfect" },
];

const EXACT_COLOUR = "#245158";
const KAPPA_COLOUR = "#9a5608";

const weekLabel = (week: string) => week.slice(5);
const tooltipValue = (value: unknown) => (typeof value === "number" ? value.toFixed(2) : "n/a");

function SquareDot(props: { cx?: number; cy?: number; value?: unknown }) {
  if (props.cx === undefined || props.cy === undefined || typeof props.value !== "number") return null;
  return <rect x={props.cx - 3.5} y={props.cy - 3.5} width={7} height={7} fill={KAPPA_COLOUR} />;
}

export function ScorecardTrendChart({ points, driftThreshold, label }: { points: TrendPoint[]; driftThreshold: number; label: string }) {
  if (!points.some((p) => p.n > 0)) {
    return (
      <p className="flex h-72 items-center justify-center rounded-md border border-dashed border-gauge-200 px-4 text-center text-sm text-gauge-700" data-testid="scorecard-trend-empty">
        No blind rechecks of {label === "Team" ? "the team's" : `${label}'s`} grades in this period yet, so there is no trend to draw.
      </p>
    );
  }
  const lowest = Math.min(0, ...points.map((p) => p.kappa ?? 0));
  const bottom = Math.floor(lowest * 5) / 5;
  return (
    <figure className="space-y-2" data-testid="scorecard-trend-chart">
      <div role="img" aria-label={`${label}: weekly exact agreement and Cohen's kappa; the figures are in the table beside the chart.`} className="h-72 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={points} margin={{ top: 8, right: 96, bottom: 8, left: 0 }}>
            {BANDS.map((band, index) => (
              <ReferenceArea
                key={band.name}
                y1={band.from}
                y2={band.to}
                fill={index % 2 ? "#eef6f6" : "#ffffff"}
                fillOpacity={1}
                ifOverflow="hidden"
                label={{ value: band.name, position: "right", fontSize: 11, fill: "#357b82" }}
              />
            ))}
            <CartesianGrid strokeDasharray="2 4" vertical={false} stroke="#d5e9ea" />
            <XAxis dataKey="week" tickFormatter={weekLabel} fontSize={11} />
            <YAxis domain={[bottom, 1]} ticks={[bottom, 0, 0.2, 0.4, 0.6, 0.8, 1].filter((t, i, all) => all.indexOf(t) === i)} fontSize={11} width={40} />
            <ReferenceLine
              y={driftThreshold}
              stroke="#b4352a"
              strokeDasharray="1 3"
              strokeWidth={2}
              label={{ value: "drift threshold", position: "insideBottomLeft", fontSize: 11, fill: "#8f2a22" }}
            />
            <Tooltip formatter={tooltipValue} labelFormatter={(week) => `Week of ${week}`} />
            <Line type="linear" dataKey="exact" name="Exact agreement" stroke={EXACT_COLOUR} strokeWidth={2} dot={{ r: 3.5, fill: EXACT_COLOUR }} connectNulls={false} isAnimationActive={false} />
            <Line type="linear" dataKey="kappa" name="Cohen's kappa" stroke={KAPPA_COLOUR} strokeWidth={2} strokeDasharray="6 4" dot={<SquareDot />} connectNulls={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="flex flex-wrap gap-x-5 gap-y-1 text-xs text-gauge-700">
        <span className="flex items-center gap-1.5">
          <svg width="28" height="10" aria-hidden>
            <line x1="0" y1="5" x2="28" y2="5" stroke={EXACT_COLOUR} strokeWidth="2" />
            <circle cx="14" cy="5" r="3.5" fill={EXACT_COLOUR} />
          </svg>
          Exact agreement (share of rechecks with the same grade)
        </span>
        <span className="flex items-center gap-1.5">
          <svg width="28" height="10" aria-hidden>
            <line x1="0" y1="5" x2="28" y2="5" stroke={KAPPA_COLOUR} strokeWidth="2" strokeDasharray="6 4" />
            <rect x="10.5" y="1.5" width="7" height="7" fill={KAPPA_COLOUR} />
          </svg>
          Cohen&apos;s kappa, over Landis &amp; Koch&apos;s bands
        </span>
        <span className="flex items-center gap-1.5">
          <svg width="28" height="10" aria-hidden>
            <line x1="0" y1="5" x2="28" y2="5" stroke="#b4352a" strokeWidth="2" strokeDasharray="1 3" />
          </svg>
          Drift threshold for exact agreement ({Math.round(driftThreshold * 100)} %)
        </span>
      </figcaption>
    </figure>
  );
}
