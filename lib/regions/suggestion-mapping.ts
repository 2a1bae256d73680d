/**
 * Suggestions as the Bench shows them: ghost shapes in the photo's upright original pixels that
 * the inspector accepts (they become regions) or dismisses. Nothing here is stored. Pure.
 *
 * The Surface is found on the preview derivative (a few megapixels are plenty for an outline), so
 * its points are scaled back per axis, original / preview — the same mapping the canvas draws the
 * preview with. Pixel candidates come from the original itself (a pixel fault is one pixel), so
 * their coordinates are already in place.
 */
import { clampPoint, type ImageSize } from "@/lib/geometry/clamp";
import type { PolygonShape, SpotShape } from "@/lib/geometry/shape";
import type { PixelCandidate } from "@/lib/imaging/pixel-candidates";

export type SuggestionGhost = { id: string; role: "surface"; shape: PolygonShape; label: string } | { id: string; role: "defect"; defect: string; shape: SpotShape; label: string };

export type SuggestionResponse = { kind: "surface" | "pixel-candidates"; ghosts: SuggestionGhost[]; note: string };

/** The smallest Spot a candidate becomes, in original px, so a one-pixel fault stays visible and measurable. */
export const MIN_CANDIDATE_RADIUS = 1;

/** Points of a polygon found on an image of size `from`, in the coordinates of size `to` (per axis). */
export function scalePolygon(shape: PolygonShape, from: ImageSize, to: ImageSize): PolygonShape {
  const sx = to.width / from.width;
  const sy = to.height / from.height;
  const round = (v: number) => Math.round(v * 100) / 100;
  return { kind: "polygon", points: shape.points.map(([x, y]) => clampPoint([round(x * sx), round(y * sy)], to)) };
}

/**
 * Pixel-fault suggestions are made only on a display part's lit test-screen views: the rule of
 * panelFor in lib/grading/measure-photo.ts (a part type with a panel resolution, a view key
 * starting with "screen"), restated here because that module pulls in sharp, which the browser
 * cannot load; a unit test keeps the two in step.
 */
export function isScreenView(partType: { panelResolution: { width: number; height: number } | null }, viewKey: string): boolean {
  return partType.panelResolution !== null && viewKey.startsWith("screen");
}

/** Candidates as Spot ghosts of their own class; classes the part type does not have are counted, not shown. */
export function candidateGhosts(candidates: readonly PixelCandidate[], allowed: readonly { key: string; label: string }[], size: ImageSize) {
  const labels = new Map(allowed.map((d) => [d.key, d.label]));
  const ghosts: SuggestionGhost[] = [];
  let withoutClass = 0;
  candidates.forEach((c, i) => {
    const label = labels.get(c.kind);
    if (!label) {
      withoutClass++;
      return;
    }
    const [x, y] = clampPoint([c.x, c.y], size);
    ghosts.push({
      id: `candidate-${i + 1}`,
      role: "defect",
      defect: c.kind,
      shape: { kind: "spot", x, y, radius: Math.max(MIN_CANDIDATE_RADIUS, c.radius) },
      label: `${label} (score ${Math.round(c.score * 100)} %)`,
    });
  });
  return { ghosts, withoutClass };
}
