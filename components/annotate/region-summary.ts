/** What the region list says about each region: its tool name and a size in original pixels. */
import type { Region } from "@/lib/annotate/types";
import { polygonArea } from "@/lib/geometry/polygon";
import { polylineLength } from "@/lib/geometry/points";
import { rulerLengthPx } from "@/lib/geometry/ruler";
import { TOOL_NAME_BY_KIND } from "@/lib/geometry/validate";

/** Box, Outline, Line, Spot (by shape), or Surface / Ruler (by role). */
export function regionKindLabel(region: Region): string {
  if (region.role === "surface") return "Surface";
  if (region.role === "ruler") return "Ruler";
  return TOOL_NAME_BY_KIND[region.shape.kind];
}

/**
 * A pixel figure for people: one decimal below 10 (a 2.5 px dust spot), whole numbers above,
 * thousands grouped with a thin space so it reads the same in every locale.
 */
export function formatPx(value: number): string {
  if (!Number.isFinite(value)) return "–";
  const rounded = Math.abs(value) < 10 ? Math.round(value * 10) / 10 : Math.round(value);
  const [whole, fraction] = Math.abs(rounded).toString().split(".");
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, "\u2009");
  return `${rounded < 0 ? "−" : ""}${grouped}${fraction ? `.${fraction}` : ""}`;
}

export function regionSizeSummary(region: Region): string {
  if (region.role === "ruler") {
    const px = rulerLengthPx(region.ruler);
    return `${formatPx(px)} px = ${formatPx(region.ruler.lengthMm)} mm (${formatPx(px / region.ruler.lengthMm)} px/mm)`;
  }
  const shape = region.shape;
  switch (shape.kind) {
    case "rect":
      return `${formatPx(shape.width)} × ${formatPx(shape.height)} px`;
    case "polygon":
      return `${formatPx(polygonArea(shape.points))} px², ${shape.points.length} points`;
    case "line":
      return `${formatPx(polylineLength(shape.points))} px long, ${formatPx(shape.width)} px wide`;
    case "spot":
      return `radius ${formatPx(shape.radius)} px`;
  }
}
