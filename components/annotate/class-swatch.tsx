"use client";

import { useId } from "react";
import { hexWithAlpha, type RegionStyle } from "@/lib/annotate/defect-styles";

/** SVG pattern content for a fill, on an 8 × 8 tile (the canvas's hatch spacing). */
function PatternMarks({ fill, colour }: { fill: RegionStyle["fill"]; colour: string }) {
  const line = { stroke: colour, strokeWidth: 1.4 };
  switch (fill) {
    case "hatch-forward":
      return <path d="M0 8 L8 0 M-4 4 L4 -4 M4 12 L12 4" {...line} />;
    case "hatch-back":
      return <path d="M0 0 L8 8 M-4 4 L4 12 M4 -4 L12 4" {...line} />;
    case "cross-hatch":
      return <path d="M0 8 L8 0 M-4 4 L4 -4 M4 12 L12 4 M0 0 L8 8 M-4 4 L4 12 M4 -4 L12 4" {...line} />;
    case "rows":
      return <path d="M0 4 L8 4" {...line} />;
    case "dots":
      return <circle cx="4" cy="4" r="1.6" fill={colour} />;
    default:
      return null;
  }
}

/**
 * A small legend mark: the class's colour, dash pattern and fill, as on the canvas. Decorative
 * (aria-hidden); the class name next to it carries the meaning.
 */
export function ClassSwatch({ style, size = "md", className = "" }: { style: RegionStyle; size?: "md" | "sm"; className?: string }) {
  // useId's characters vary between React versions; keep an id that is safe inside url(#…).
  const patternId = `swatch-${useId().replace(/[^A-Za-z0-9_-]/g, "")}`;
  const dash = style.stroke.dash.length ? style.stroke.dash.map((d) => Math.max(d, 0.01)).join(" ") : undefined;
  const hasPattern = style.fill !== "tint" && style.fill !== "none";
  return (
    <svg viewBox="0 0 32 18" width={size === "sm" ? 24 : 32} height={size === "sm" ? 14 : 18} aria-hidden="true" className={`shrink-0 rounded-sm bg-gauge-700 ${className}`}>
      {hasPattern && (
        <defs>
          <pattern id={patternId} width="8" height="8" patternUnits="userSpaceOnUse">
            <PatternMarks fill={style.fill} colour={style.colour} />
          </pattern>
        </defs>
      )}
      <rect x="3" y="3" width="26" height="12" fill={style.tintOpacity > 0 ? hexWithAlpha(style.colour, style.tintOpacity * 2) : "none"} />
      {hasPattern && <rect x="3" y="3" width="26" height="12" fill={`url(#${patternId})`} />}
      <rect x="3" y="3" width="26" height="12" fill="none" stroke={style.halo} strokeWidth={style.strokeWidth + 2} strokeDasharray={dash} strokeLinecap={style.stroke.lineCap} />
      <rect x="3" y="3" width="26" height="12" fill="none" stroke={style.colour} strokeWidth={style.strokeWidth} strokeDasharray={dash} strokeLinecap={style.stroke.lineCap} />
    </svg>
  );
}
