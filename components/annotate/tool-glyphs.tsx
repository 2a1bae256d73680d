/**
 * Partproof's own glyphs for the tool rail, drawn for this product on a 24 × 24 grid (stroke
 * 1.75, round joins). They show what each tool leaves on the photo rather than a pointer:
 * Select is a region with its grips, Surface the part outline of our logo (a plate with one cut
 * corner), Spot a ringed dot, Line a scratch with its width, Ruler a bar with millimetre ticks.
 * Decorative: the button's own name carries the meaning.
 */
import type { ToolId } from "@/lib/annotate/types";

const PATHS: Record<ToolId | "undo" | "redo" | "keys" | "eye" | "fold", React.ReactNode> = {
  select: (
    <>
      <rect x="6" y="6" width="12" height="12" strokeDasharray="2.5 2" />
      {[
        [6, 6],
        [18, 6],
        [6, 18],
        [18, 18],
      ].map(([x, y]) => (
        <rect key={`${x}-${y}`} x={x - 1.75} y={y - 1.75} width="3.5" height="3.5" fill="currentColor" stroke="none" />
      ))}
    </>
  ),
  box: (
    <>
      <rect x="4.5" y="7" width="15" height="10.5" rx="0.5" />
      <path d="M9 12.5l2 -2l2.5 2.5l2 -2" strokeWidth="1.4" />
    </>
  ),
  outline: (
    <>
      <path d="M5 9.5L10.5 5L19 8.5L17 17.5L8 19Z" />
      {[
        [5, 9.5],
        [10.5, 5],
        [19, 8.5],
        [17, 17.5],
        [8, 19],
      ].map(([x, y]) => (
        <circle key={`${x}-${y}`} cx={x} cy={y} r="1.5" fill="currentColor" stroke="none" />
      ))}
    </>
  ),
  line: (
    <>
      <path d="M4 16c3-1 4-6 8-6s4 4 8-2" strokeWidth="3.2" strokeOpacity="0.35" />
      <path d="M4 16c3-1 4-6 8-6s4 4 8-2" />
    </>
  ),
  spot: (
    <>
      <circle cx="12" cy="12" r="6.5" />
      <circle cx="12" cy="12" r="1.8" fill="currentColor" stroke="none" />
    </>
  ),
  surface: <path d="M5 4h10l4 4v12H5z M15 4v4h4" strokeDasharray="3 1.6" />,
  ruler: (
    <>
      <rect x="3" y="9" width="18" height="6.5" rx="0.8" />
      <path d="M6.5 9v2.5M9.5 9v3.5M12.5 9v2.5M15.5 9v3.5M18.5 9v2.5" strokeWidth="1.3" />
    </>
  ),
  undo: <path d="M9 7L5 11l4 4M5 11h9a5 5 0 010 10h-2" />,
  redo: <path d="M15 7l4 4-4 4M19 11h-9a5 5 0 000 10h2" />,
  keys: (
    <>
      <rect x="3.5" y="7" width="17" height="11" rx="1.5" />
      <path d="M7 10.5h1M11 10.5h2M16 10.5h1M7 14.5h10" strokeWidth="1.5" />
    </>
  ),
  eye: (
    <>
      <path d="M2.5 12s3.5-6 9.5-6 9.5 6 9.5 6-3.5 6-9.5 6-9.5-6-9.5-6z" />
      <circle cx="12" cy="12" r="2.5" />
    </>
  ),
  fold: <path d="M9 5l7 7-7 7" />,
};

export type GlyphName = keyof typeof PATHS;

export function Glyph({ name, className = "h-5 w-5" }: { name: GlyphName; className?: string }) {
  return (
    <svg viewBox="0 0 24 24" className={className} fill="none" stroke="currentColor" strokeWidth="1.75" strokeLinecap="round" strokeLinejoin="round" aria-hidden="true">
      {PATHS[name]}
    </svg>
  );
}
