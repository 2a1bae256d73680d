import type { PixelRect } from "@/lib/imaging/raster/span-areas";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Shape } from "@/lib/geometry/shape";

/**
 * After submitting: the key over the grader's own marks, drawn as SVG in the photo's pixel space
 * over the preview (fitted like `object-contain`). Four kinds, told apart by pattern as well as
 * colour, so they read in greyscale and for colour-blind eyes:
 * - the key: a solid outline with a dark halo;
 * - your marks: a dashed outline;
 * - missed (key pixels you did not mark): diagonal hatching;
 * - extra (your pixels outside the key): dots.
 */
export const RESULT_LOOKS = {
  key: { colour: "#f8fafc", label: "The key (solid outline)" },
  mine: { colour: "#38bdf8", label: "Your marks (dashed outline)" },
  missed: { colour: "#f97316", label: "Missed: in the key, not marked by you (hatched)" },
  extra: { colour: "#e879f9", label: "Extra: marked by you, not in the key (dotted)" },
} as const;

export function ResultPatterns({ id, scale = 1 }: { id: string; scale?: number }) {
  const s = 8 * scale;
  return (
    <defs>
      <pattern id={`${id}-missed`} patternUnits="userSpaceOnUse" width={s} height={s} patternTransform="rotate(45)">
        <rect width={s} height={s} fill={RESULT_LOOKS.missed.colour} fillOpacity={0.18} />
        <line x1={0} y1={0} x2={0} y2={s} stroke={RESULT_LOOKS.missed.colour} strokeWidth={s / 3} />
      </pattern>
      <pattern id={`${id}-extra`} patternUnits="userSpaceOnUse" width={s} height={s}>
        <rect width={s} height={s} fill={RESULT_LOOKS.extra.colour} fillOpacity={0.15} />
        <circle cx={s / 2} cy={s / 2} r={s / 4} fill={RESULT_LOOKS.extra.colour} />
      </pattern>
    </defs>
  );
}

function ShapeOutline({ shape, stroke, width, dash, minSpot }: { shape: Shape; stroke: string; width: number; dash?: string; minSpot: number }) {
  const line = { fill: "none", stroke, strokeWidth: width, strokeDasharray: dash, vectorEffect: "non-scaling-stroke" as const, strokeLinejoin: "round" as const };
  switch (shape.kind) {
    case "rect":
      return <rect x={shape.x} y={shape.y} width={shape.width} height={shape.height} {...line} />;
    case "polygon":
      return <polygon points={shape.points.map((p) => p.join(",")).join(" ")} {...line} />;
    case "spot":
      return <circle cx={shape.x} cy={shape.y} r={Math.max(shape.radius, minSpot)} {...line} />;
    case "line":
      return <polyline points={shape.points.map((p) => p.join(",")).join(" ")} {...line} />;
  }
}

export function ResultOverlay({
  id,
  original,
  keyRegions,
  mine,
  areas,
}: {
  id: string;
  original: { width: number; height: number };
  keyRegions: RegionSetPayload;
  mine: RegionSetPayload;
  areas: Record<string, { missed: PixelRect[]; extra: PixelRect[] }>;
}) {
  const minSpot = Math.max(original.width, original.height) / 150;
  // Hatching in photo pixels, sized so it reads at the preview's scale.
  const scale = Math.max(1, Math.max(original.width, original.height) / 800);
  const all = Object.values(areas);
  return (
    <svg
      viewBox={`0 0 ${original.width} ${original.height}`}
      preserveAspectRatio="xMidYMid meet"
      className="pointer-events-none absolute inset-0 h-full w-full"
      aria-hidden
      data-testid="result-overlay"
    >
      <ResultPatterns id={id} scale={scale} />
      <g data-kind="missed">{all.flatMap((a, i) => a.missed.map((r, k) => <rect key={`${i}-${k}`} x={r.x} y={r.y} width={r.width} height={r.height} fill={`url(#${id}-missed)`} />))}</g>
      <g data-kind="extra">{all.flatMap((a, i) => a.extra.map((r, k) => <rect key={`${i}-${k}`} x={r.x} y={r.y} width={r.width} height={r.height} fill={`url(#${id}-extra)`} />))}</g>
      <g data-kind="mine">
        {mine.regions.map((r) => (
          <ShapeOutline key={r.id} shape={r.shape} stroke={RESULT_LOOKS.mine.colour} width={2} dash="6 4" minSpot={minSpot} />
        ))}
      </g>
      <g data-kind="key">
        {keyRegions.regions.map((r) => (
          <g key={r.id}>
            <ShapeOutline shape={r.shape} stroke="#0f172a" width={4} minSpot={minSpot} />
            <ShapeOutline shape={r.shape} stroke={RESULT_LOOKS.key.colour} width={2} minSpot={minSpot} />
          </g>
        ))}
      </g>
    </svg>
  );
}

/** The legend: each kind's own sample, pattern and outline as drawn on the photos. */
export function ResultLegend() {
  const id = "legend";
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-gauge-800" data-testid="result-legend">
      <li className="flex items-center gap-1.5">
        <svg width="28" height="16" aria-hidden className="rounded bg-gauge-900">
          <rect x="4" y="3" width="20" height="10" fill="none" stroke="#0f172a" strokeWidth="4" />
          <rect x="4" y="3" width="20" height="10" fill="none" stroke={RESULT_LOOKS.key.colour} strokeWidth="2" />
        </svg>
        {RESULT_LOOKS.key.label}
      </li>
      <li className="flex items-center gap-1.5">
        <svg width="28" height="16" aria-hidden className="rounded bg-gauge-900">
          <rect x="4" y="3" width="20" height="10" fill="none" stroke={RESULT_LOOKS.mine.colour} strokeWidth="2" strokeDasharray="6 4" />
        </svg>
        {RESULT_LOOKS.mine.label}
      </li>
      {(["missed", "extra"] as const).map((kind) => (
        <li key={kind} className="flex items-center gap-1.5">
          <svg width="28" height="16" aria-hidden className="rounded bg-gauge-900">
            <ResultPatterns id={`${id}-${kind}`} />
            <rect x="2" y="2" width="24" height="12" fill={`url(#${id}-${kind}-${kind})`} />
          </svg>
          {RESULT_LOOKS[kind].label}
        </li>
      ))}
    </ul>
  );
}
