/** Public types of the annotation canvas (its props) and the entries its parts share. */
import type { ReactNode, Ref } from "react";
import type { AddOutcome, NewRegion } from "@/lib/annotate/bulk-edits";
import type { Size } from "@/lib/annotate/coords";
import type { ShortcutGroup } from "@/lib/annotate/tools";
import type { ToolId } from "@/lib/annotate/types";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { RegionStyle } from "@/lib/annotate/defect-styles";
import type { HistoryAvailability } from "./use-committed-changes";
import type { ViewCommand } from "./view-commands";
import type { ZoneInput } from "./zones";

export type { HistoryAvailability } from "./use-committed-changes";
export type { ZoneInput } from "./zones";

/** A defect class of the part type (the canvas orders them by severity for the number keys). */
export type AllowedDefect = Readonly<{ key: string; label: string; severity: DefectSeverity }>;

/** A class with the style it is drawn in. */
export type ClassEntry = AllowedDefect & Readonly<{ style: RegionStyle; index: number }>;

export type AnnotationCanvasProps = {
  /** URL of the preview derivative (the canvas never loads the original). */
  imageUrl: string;
  /** Upright original size in pixels: every coordinate in and out is in this space. */
  original: Size;
  /** Pixel size of the preview derivative (its real size wins once it has loaded). */
  preview: Size;
  allowedDefects: readonly AllowedDefect[];
  /** The view's inspection zones, in 0..1 of the Surface's bounding box. */
  zones?: readonly ZoneInput[];
  /** Saved regions; read once on mount (give the canvas a new `key` to load another set). */
  initialRegions?: RegionSetPayload | null;
  /** After every committed edit (also undo/redo), with the whole region set: for autosave. */
  onChange?: (payload: RegionSetPayload) => void;
  onHistoryChange?: (availability: HistoryAvailability) => void;
  /**
   * Receives the imperative handle. A prop of its own rather than `ref`, because next/dynamic
   * (the lazy wrapper) keeps `ref` for its own loader object and would not pass it on.
   */
  handleRef?: Ref<AnnotationCanvasHandle>;
  /** View only: pan, zoom, hide classes and select from the list; no editing. */
  readOnly?: boolean;
  /** Suggested shapes drawn as ghosts over the photo (not regions until accepted through the handle). */
  ghosts?: readonly GhostShape[];
  /**
   * Where the region list goes: an element elsewhere on the page (a side panel) gets it through a
   * portal and the stage takes the full width; without one it sits beside the stage.
   */
  regionListContainer?: HTMLElement | null;
  /** Another part of the page whose key presses the canvas takes too (the Bench's photo strip). */
  keyArea?: HTMLElement | null;
  /** Take keyboard focus on mount, unless another control outside `keyArea` has it. */
  autoFocus?: boolean;
  /** Tool and class to open with (the ones in hand on the previous photo). */
  startWith?: ToolInHand | null;
  /** After the tool or class in hand changes. */
  onToolChange?: (inHand: ToolInHand) => void;
  /** What the classes are when they are not defect classes (the part type editor's zones): named so, no severity groups. */
  classKind?: string;
  /** Shown at the end of the class bar (the Bench puts the save status there). */
  toolbarEnd?: ReactNode;
  /** The page's own keys, listed in the `?` sheet after the canvas's. */
  pageShortcuts?: readonly ShortcutGroup[];
  className?: string;
};

export type ToolInHand = Readonly<{ tool: ToolId; defect: string | null }>;

/**
 * A suggestion shown on the canvas: dashed, unfilled, never hit-tested or saved. A learned one
 * (lib/suggestions) carries the model that made it and its score, so the Bench can record what
 * the inspector did with it.
 */
export type GhostShape = Readonly<
  { id: string; label: string } & ({ role: "surface"; shape: PolygonShape } | { role: "defect"; defect: string; shape: Shape; learned?: { modelId: string; score: number } })
>;

/** Imperative handle (via the `handleRef` prop) for a page's own buttons or tests. */
export type AnnotationCanvasHandle = {
  undo(): void;
  redo(): void;
  view(command: ViewCommand): void;
  focus(): void;
  /** The current region set, as onChange would report it. */
  getRegions(): RegionSetPayload;
  /** Puts `payload` in place of every region as one undo step (another session's save, or a merge). */
  replaceRegions(payload: RegionSetPayload): void;
  /** Adds new regions (accepted suggestions) as one undo step, each with a fresh id; says what was left out and why. */
  addRegions(regions: readonly NewRegion[]): Pick<AddOutcome, "ids" | "skipped">;
};

export type ToolbarActions = {
  tool(id: ToolId): void;
  defect(key: string): void;
  toggleHidden(key: string): void;
  lineWidth(width: number): void;
  view(command: ViewCommand): void;
  undo(): void;
  redo(): void;
  rulerLength(lengthMm: number): void;
  cancelRuler(): void;
  showShortcuts(): void;
};
