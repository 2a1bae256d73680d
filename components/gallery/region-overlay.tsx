import { defectStyleMap } from "@/lib/annotate/class-looks";
import { SURFACE_STYLE, UNKNOWN_DEFECT_STYLE, type RegionStyle } from "@/lib/annotate/defect-styles";
import type { Shape } from "@/lib/geometry/shape";
import type { RegionSetPayload } from "@/lib/geometry/validate";

/**
 * An item's regions drawn over its thumbnail, in the Bench's class looks (colour and dash follow
 * the class key, lib/annotate/class-looks.ts), as SVG in the photo's own pixel space fitted into
 * the box the way `object-contain` fits the image, so marks and photo letterbox alike. Strokes keep their screen width at any size (non-scaling-stroke); a Line shows
 * its measured width as a translucent band under the dashed centre line, and a Spot never shrinks
 * below a few screen pixels, so a dead pixel stays findable on a thumbnail.
 */
export function RegionOverlay({
  regions,
  original,
  classKeys,
  showSurface = false,
  className = "",
}: {
  regions: RegionSetPayload;
  original: { width: number; height: number };
  classKeys: readonly string[];
  showSurface?: boolean;
  className?: string;
}) {
  const styles = defectStyleMap(classKeys);
  const minSpot = Math.max(original.width, original.height) / 90;
  return (
    <svg viewBox={`0 0 ${original.width} ${original.height}`} preserveAspectRatio="xMidYMid meet" className={`pointer-events-none absolute inset-0 h-full w-full ${className}`} aria-hidden>
      {showSurface && regions.surfaces.map((s) => <ShapeMark key={s.id} shape={s.shape} style={SURFACE_STYLE} minSpot={minSpot} />)}
      {regions.regions.map((r) => (
        <ShapeMark key={r.id} shape={r.shape} style={styles.get(r.defect) ?? UNKNOWN_DEFECT_STYLE} minSpot={minSpot} />
      ))}
    </svg>
  );
}

function ShapeMark({ shape, style, minSpot }: { shape: Shape; style: RegionStyle; minSpot: number }) {
  const outline = {
    fill: "none",
    stroke: style.colour,
    strokeWidth: style.strokeWidth,
    strokeDasharray: style.stroke.dash.join(" ") || undefined,
    strokeLinecap: style.stroke.lineCap,
    strokeLinejoin: "round" as const,
    vectorEffect: "non-scaling-stroke" as const,
  };
  const halo = { fill: "none", stroke: style.halo, strokeWidth: style.strokeWidth + 2, strokeLinejoin: "round" as const, vectorEffect: "non-scaling-stroke" as const };
  const tint = { fill: style.colour, fillOpacity: Math.max(style.tintOpacity, 0.18), stroke: "none" };
  switch (shape.kind) {
    case "rect": {
      const g = { x: shape.x, y: shape.y, width: shape.width, height: shape.height };
      return (
        <g>
          <rect {...g} {...tint} />
          <rect {...g} {...halo} />
          <rect {...g} {...outline} />
        </g>
      );
    }
    case "polygon": {
      const points = shape.points.map((p) => p.join(",")).join(" ");
      return (
        <g>
          <polygon points={points} {...tint} />
          <polygon points={points} {...halo} />
          <polygon points={points} {...outline} />
        </g>
      );
    }
    case "spot": {
      const g = { cx: shape.x, cy: shape.y, r: Math.max(shape.radius, minSpot) };
      return (
        <g>
          <circle {...g} {...tint} />
          <circle {...g} {...halo} />
          <circle {...g} {...outline} />
        </g>
      );
    }
    case "line": {
      const points = shape.points.map((p) => p.join(",")).join(" ");
      return (
        <g>
          <polyline points={points} fill="none" stroke={style.colour} strokeOpacity={0.3} strokeWidth={shape.width} strokeLinecap="round" strokeLinejoin="round" />
          <polyline points={points} {...halo} />
          <polyline points={points} {...outline} />
        </g>
      );
    }
  }
}
