/**
 * The annotation model's records. Everything is immutable by convention (Readonly at the top, and
 * no function in lib/annotate mutates its input): an edit returns a new state, so React can
 * compare by reference and history can keep old states for free.
 */
import type { ImageSize } from "@/lib/geometry/clamp";
import type { RulerMark } from "@/lib/geometry/ruler";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
import type { ImagePoint, Viewport } from "./coords";

export type RegionId = string;

/** A marked defect: any shape, with a defect class from the part type's allowed list. */
export type DefectRegion = Readonly<{ id: RegionId; role: "defect"; defect: string; shape: Shape }>;
/**
 * The part's own visible outline (the Surface tool); coverage shares are taken against it.
 * A photo may hold several (two faces or pieces of one part in view); coverage uses their union.
 */
export type SurfaceRegion = Readonly<{ id: RegionId; role: "surface"; shape: PolygonShape }>;
/**
 * The calibration ruler: two points and the real length between them. Kept apart from `Shape`
 * (it paints nothing and is never measured as a defect); one per photo, a new one replaces it.
 */
export type RulerRegion = Readonly<{ id: RegionId; role: "ruler"; ruler: RulerMark }>;

export type Region = DefectRegion | SurfaceRegion | RulerRegion;
export type RegionRole = Region["role"];

export type ToolId = "select" | "box" | "outline" | "line" | "spot" | "surface" | "ruler";

/** Pointer modifiers as the canvas reads them from the DOM event. */
export type PointerModifiers = Readonly<{
  shift: boolean;
  alt: boolean;
  /** Ctrl on Windows/Linux, Cmd on macOS. */
  mod: boolean;
  /** MouseEvent.detail: 2 on the second press of a double-click. */
  clickCount: number;
}>;

export const NO_MODIFIERS: PointerModifiers = { shift: false, alt: false, mod: false, clickCount: 1 };

/** A shape being drawn, before it becomes a region. */
export type Draft =
  | Readonly<{ tool: "box"; start: ImagePoint; current: ImagePoint }>
  | Readonly<{
      tool: "outline" | "surface" | "line";
      points: readonly ImagePoint[];
      /** Where the pointer is, for the rubber-band segment to the next vertex. */
      hover: ImagePoint | null;
      /** The button is down (a drag adds freehand points). */
      pressed: boolean;
      /** The whole draft is one press-drag-release stroke, which finishes on release. */
      freehand: boolean;
    }>
  | Readonly<{ tool: "spot"; centre: ImagePoint; radius: number; dragged: boolean }>
  | Readonly<{
      tool: "ruler";
      a: ImagePoint;
      b: ImagePoint;
      /** "placing": the second point is not fixed yet; "length": waiting for setRulerLength. */
      phase: "placing" | "length";
      pressed: boolean;
    }>;

/** A grip on the selected region that can be dragged. */
export type Handle = Readonly<{ kind: "rect"; corner: RectHandle }> | Readonly<{ kind: "vertex"; index: number }> | Readonly<{ kind: "radius" }> | Readonly<{ kind: "ruler-end"; end: "a" | "b" }>;

export type RectHandle = "nw" | "n" | "ne" | "e" | "se" | "s" | "sw" | "w";

/** A drag of an existing region with the Select tool (one history entry from press to release). */
export type Drag = Readonly<{
  regionId: RegionId;
  /** Where the press happened; moves are computed from here and `original`, never step by step. */
  origin: ImagePoint;
  original: Region;
  target: Handle | Readonly<{ kind: "body" }>;
}>;

/** What an undo step restores. */
export type Snapshot = Readonly<{ regions: readonly Region[]; selectedId: RegionId | null }>;

/**
 * Undo/redo stacks. The present is the state's own `regions` and `selectedId` (kept there so
 * readers never dig into history); `pending` is the present as it was when a drag began.
 */
export type History = Readonly<{
  past: readonly Snapshot[];
  future: readonly Snapshot[];
  pending: Snapshot | null;
  limit: number;
}>;

export type AnnotationState = Readonly<{
  /** Upright original size of the photo; fixed for the state's life. */
  image: ImageSize;
  /** The part type's defect classes, in the order number keys 1–9 pick them. */
  allowedDefects: readonly string[];
  /** Drawing order: later regions are drawn on top. */
  regions: readonly Region[];
  selectedId: RegionId | null;
  activeTool: ToolId;
  /** Class given to new defect regions; null only when the part type has no classes. */
  activeDefect: string | null;
  /** Classes whose regions are not drawn and cannot be hit. */
  hiddenDefects: readonly string[];
  draft: Draft | null;
  drag: Drag | null;
  viewport: Viewport;
  /** Stroke width for new lines, original px. */
  lineWidth: number;
  history: History;
  /** New ids are `${idPrefix}-${nextIdNumber}`; the counter never goes back, even on undo. */
  idPrefix: string;
  nextIdNumber: number;
}>;
