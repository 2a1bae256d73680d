/**
 * A photo with regions drawn over it as SVG in the photo's own pixel coordinates (viewBox = the
 * original's size, so no scaling maths): one side of an adjudication, or the overlay of both.
 * Classes keep the Bench's looks (lib/annotate/class-looks.ts); the overlay tells the two sides
 * apart by pattern as well as colour, so it reads in greyscale and for colour-blind people.
 */
import { defectStyleMap } from "@/lib/annotate/class-looks";
import type { Shape } from "@/lib/geometry/shape";
import type { PixelRect } from "@/lib/imaging/raster/span-areas";

type Region = { id: string; defect: string; shape: Shape };

function ShapeSvg({ shape, colour, width }: { shape: Shape; colour: string; width: number }) {
  const common = { fill: "none", stroke: colour, strokeWidth: width, vectorEffect: "non-scaling-stroke" as const };
  if (shape.kind === "rect") return <rect x={shape.x} y={shape.y} width={shape.width} height={shape.height} {...common} />;
  if (shape.kind === "polygon") return <polygon points={shape.points.map((p) => p.join(",")).join(" ")} {...common} />;
  if (shape.kind === "line")
    return <polyline points={shape.points.map((p) => p.join(",")).join(" ")} {...common} strokeWidth={Math.max(shape.width, 1)} vectorEffect={undefined} strokeOpacity={0.7} />;
  return <circle cx={shape.x} cy={shape.y} r={shape.radius} {...common} />;
}

export function RegionsOnPhoto({ photoId, width, height, regions, label }: { photoId: string; width: number; height: number; regions: readonly Region[]; label: string }) {
  const looks = defectStyleMap([...new Set(regions.map((r) => r.defect))]);
  return (
    <svg viewBox={`0 0 ${width} ${height}`} className="h-auto w-full rounded bg-gauge-900" role="img" aria-label={label}>
      <image href={`/api/photos/${photoId}/preview`} x={0} y={0} width={width} height={height} />
      {regions.map((r) => (
        <ShapeSvg key={r.id} shape={r.shape} colour={looks.get(r.defect)?.colour ?? "#fff"} width={2} />
      ))}
    </svg>
  );
}

export type OverlayAreas = Record<string, { onlyFirst: PixelRect[]; onlyRecheck: PixelRect[]; shared: PixelRect[] }>;

/** Legend swatch and fill of each kind of area in the overlay. */
export const OVERLAY_KEY = [
  { kind: "onlyFirst", label: "Only the first grade marked this", fill: "url(#only-first)", swatch: "bg-[repeating-linear-gradient(45deg,#b45309_0_2px,transparent_2px_6px)]" },
  { kind: "onlyRecheck", label: "Only the recheck marked this", fill: "url(#only-recheck)", swatch: "bg-[radial-gradient(#1d4ed8_1.5px,transparent_1.5px)] bg-[length:6px_6px]" },
  { kind: "shared", label: "Both marked this", fill: "rgba(255,255,255,0.55)", swatch: "bg-white/60 border border-gauge-400" },
] as const;

export function OverlayOnPhoto({ photoId, width, height, areas, label }: { photoId: string; width: number; height: number; areas: OverlayAreas; label: string }) {
  const scale = Math.max(width, height) / 400;
  return (
    <svg viewBox={`0 0 ${width} ${height}`} className="h-auto w-full rounded bg-gauge-900" role="img" aria-label={label}>
      <defs>
        <pattern id="only-first" patternUnits="userSpaceOnUse" width={6 * scale} height={6 * scale} patternTransform="rotate(45)">
          <rect width={2 * scale} height={6 * scale} fill="#b45309" />
        </pattern>
        <pattern id="only-recheck" patternUnits="userSpaceOnUse" width={6 * scale} height={6 * scale}>
          <circle cx={3 * scale} cy={3 * scale} r={1.5 * scale} fill="#1d4ed8" />
        </pattern>
      </defs>
      <image href={`/api/photos/${photoId}/preview`} x={0} y={0} width={width} height={height} opacity={0.6} />
      {Object.entries(areas).flatMap(([defect, sides]) =>
        OVERLAY_KEY.flatMap((key) => sides[key.kind].map((r, i) => <rect key={`${defect}-${key.kind}-${i}`} x={r.x} y={r.y} width={r.width} height={r.height} fill={key.fill} />)),
      )}
    </svg>
  );
}
