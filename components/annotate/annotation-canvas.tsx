"use client";

/**
 * The Bench annotation canvas: the photo, its regions and the marking tools. This component only
 * wires things together (DEVELOPERS.md, "Annotation canvas"): the pure model in lib/annotate owns every rule, the
 * hooks here turn pointer, wheel and key events into model edits, and three thin Konva layers
 * draw the photo, the regions and the work in progress. Import it through
 * annotation-canvas-lazy.tsx: Konva must never run on the server.
 */
import { useCallback, useEffect, useId, useImperativeHandle, useMemo, useRef, useState } from "react";
import { createPortal } from "react-dom";
import { Stage } from "react-konva";
import { addNewRegions, replaceAllRegions } from "@/lib/annotate/bulk-edits";
import { benchClassOrder, startingClass } from "@/lib/annotate/class-order";
import { fitToView, type Viewport } from "@/lib/annotate/coords";
import { isRegionVisible } from "@/lib/annotate/hit-test";
import { createAnnotationState, selectedRegion, setViewport } from "@/lib/annotate/model";
import { regionsFromPayload, toRegionSetPayload } from "@/lib/annotate/serialise";
import { activateTool, draftHint, TOOLS, type ShortcutGroup } from "@/lib/annotate/tools";
import type { AnnotationState, ToolId } from "@/lib/annotate/types";
import type { PolygonShape } from "@/lib/geometry/shape";
import { edit, useCanvasStore } from "./canvas-store";
import { defectStyleMap } from "@/lib/annotate/class-looks";
import { RULER_STYLE, SURFACE_STYLE, UNKNOWN_DEFECT_STYLE, type RegionStyle } from "@/lib/annotate/defect-styles";
import { ImageLayer } from "./image-layer";
import { InteractionLayer } from "./interaction-layer";
import { RegionList } from "./region-list";
import { RegionsLayer } from "./regions-layer";
import { RulerLengthInput } from "./ruler-length-input";
import { ShortcutSheet } from "./shortcut-sheet";
import { Toolbar } from "./toolbar";
import type { AnnotationCanvasProps, ClassEntry, GhostShape, ZoneInput } from "./types";
import { useCanvasActions } from "./use-canvas-actions";
import { useCanvasKeys } from "./use-canvas-keys";
import { useCommittedChanges } from "./use-committed-changes";
import { useElementSize } from "./use-element-size";
import { useHtmlImage } from "./use-html-image";
import { usePointerInput } from "./use-pointer-input";
import { zoneBox, zonesToImage } from "./zones";

export type { AnnotationCanvasHandle, AnnotationCanvasProps } from "./types";

const NO_ZONES: readonly ZoneInput[] = [];
const NO_GHOSTS: readonly GhostShape[] = [];
const NO_SHORTCUTS: readonly ShortcutGroup[] = [];

/** Start of this session's region ids: random, so ids stay unique across sessions and devices. */
function newIdPrefix(): string {
  const words = crypto.getRandomValues(new Uint32Array(2));
  return Array.from(words, (w) => w.toString(16).padStart(8, "0")).join("");
}

function draftStyleOf(state: AnnotationState, styles: ReadonlyMap<string, RegionStyle>): RegionStyle {
  if (state.activeTool === "surface") return SURFACE_STYLE;
  if (state.activeTool === "ruler") return RULER_STYLE;
  return (state.activeDefect && styles.get(state.activeDefect)) || UNKNOWN_DEFECT_STYLE;
}

function statusText(state: AnnotationState, imageStatus: "loading" | "ready" | "failed", readOnly: boolean): string {
  if (imageStatus === "failed") return "The photo could not be loaded. Check the connection and reload the page; the regions are kept.";
  const hint = draftHint(state);
  if (hint) return hint;
  if (imageStatus === "loading") return "Loading the photo…";
  if (state.activeDefect === null && !readOnly) {
    return state.allowedDefects.length === 0 ? "This part type has no defect classes: only Surface and Ruler can be drawn." : "Choose a defect class to draw with: every class here is critical, so none is chosen for you.";
  }
  return readOnly ? "View only. Drag to pan, scroll or pinch to zoom. Press ? for shortcuts." : "Press ? for the keyboard shortcuts.";
}

export function AnnotationCanvas(props: AnnotationCanvasProps) {
  const { handleRef, imageUrl, original, preview, allowedDefects, zones = NO_ZONES, initialRegions, onChange, onHistoryChange, readOnly = false, className = "" } = props;
  const { ghosts = NO_GHOSTS, regionListContainer = null, keyArea = null, autoFocus = false, startWith, onToolChange, pageShortcuts = NO_SHORTCUTS } = props;
  // Number keys follow the severity groups (least severe first); the look follows the class key.
  const ordered = useMemo(() => benchClassOrder(allowedDefects), [allowedDefects]);
  const defectKeys = useMemo(() => ordered.map((d) => d.key), [ordered]);
  const { state, dispatch, latestRef } = useCanvasStore(() => {
    const startingDefect = startWith?.defect && defectKeys.includes(startWith.defect) ? startWith.defect : startingClass(allowedDefects);
    const fresh = createAnnotationState({ image: original, allowedDefects: defectKeys, startingDefect, idPrefix: newIdPrefix(), regions: initialRegions ? regionsFromPayload(initialRegions) : [] });
    return startWith?.tool && !readOnly ? activateTool(fresh, startWith.tool) : fresh;
  });
  const rootRef = useRef<HTMLDivElement>(null);
  const containerRef = useRef<HTMLDivElement>(null);
  const spaceHeldRef = useRef(false);
  const fittedRef = useRef<Viewport | null>(null);
  const stageSize = useElementSize(containerRef);
  const { image, status: imageStatus } = useHtmlImage(imageUrl);
  const [sheetOpen, setSheetOpen] = useState(false);
  const statusId = useId();

  const styles = useMemo(() => defectStyleMap(defectKeys), [defectKeys]);
  const classes = useMemo<ClassEntry[]>(() => ordered.map((d, index) => ({ ...d, index, style: styles.get(d.key) ?? UNKNOWN_DEFECT_STYLE })), [ordered, styles]);
  const classByKey = useMemo(() => new Map(classes.map((c) => [c.key, c])), [classes]);
  // Keyed on the box's numbers, not on the regions, so a drag that leaves the surfaces alone keeps the zones object.
  const { minX, minY, maxX, maxY, source: zoneSource } = zoneBox(state.regions.flatMap((r): PolygonShape[] => (r.role === "surface" ? [r.shape] : [])), original);
  // Zones hang on the Surface: before one is traced they would only cover the backdrop.
  const imageZones = useMemo(() => (zoneSource === "surface" ? zonesToImage(zones, { minX, minY, maxX, maxY }) : []), [zones, zoneSource, minX, minY, maxX, maxY]);
  // Regions stay inside the photo; labels and halos may reach a little past its edge.
  const content = useMemo(() => ({ minX: -0.05 * original.width, minY: -0.05 * original.height, maxX: 1.05 * original.width, maxY: 1.05 * original.height }), [original]);
  const scene = useMemo(() => ({ regions: state.regions, hiddenDefects: state.hiddenDefects, styles, zones: imageZones }), [state.regions, state.hiddenDefects, styles, imageZones]);

  const history = useCommittedChanges(state, onChange, onHistoryChange);
  const showShortcuts = useCallback(() => setSheetOpen(true), []);
  const focusStage = useCallback(() => containerRef.current?.focus({ preventScroll: true }), []);
  const actions = useCanvasActions({ dispatch, stageSize, fittedRef, image: original, onShowShortcuts: showShortcuts, focusStage });
  useCanvasKeys({ rootRef, alsoIn: [regionListContainer, keyArea], latestRef, dispatch, readOnly, onView: actions.view, spaceHeldRef, onShowShortcuts: showShortcuts });

  // The photo being marked takes the keyboard when it opens (e.g. after a thumbnail click),
  // unless the inspector has moved on to another control meanwhile.
  useEffect(() => {
    if (!autoFocus) return;
    const active = document.activeElement;
    if (!active || active === document.body || keyArea?.contains(active)) focusStage();
  }, [autoFocus, keyArea, focusStage]);

  // Tell the page which tool and class are in hand, so the next photo opens with the same ones.
  const { activeTool, activeDefect } = state;
  useEffect(() => onToolChange?.({ tool: activeTool, defect: activeDefect }), [onToolChange, activeTool, activeDefect]);
  const pointer = usePointerInput({ containerRef, latestRef, dispatch, readOnly, spaceHeldRef });

  // Fit the photo when the stage first gets a size, and again on resize until the inspector zooms or pans.
  useEffect(() => {
    if (!stageSize || (fittedRef.current !== null && latestRef.current.viewport !== fittedRef.current)) return;
    const fit = fitToView(original, stageSize);
    fittedRef.current = fit;
    dispatch(edit((s) => setViewport(s, fit)));
  }, [stageSize, original, dispatch, latestRef]);

  useImperativeHandle(
    handleRef,
    () => ({
      undo: actions.undo,
      redo: actions.redo,
      view: actions.view,
      focus: focusStage,
      getRegions: () => toRegionSetPayload(latestRef.current),
      replaceRegions: (payload) => dispatch(edit((s) => replaceAllRegions(s, regionsFromPayload(payload)))),
      addRegions: (items) => {
        // The edit runs in the reducer like every other; the report reads the same pure step on
        // the latest committed state (nothing can change in between: this is one event).
        const { ids, skipped } = addNewRegions(latestRef.current, items);
        dispatch(edit((s) => addNewRegions(s, items).state));
        return { ids, skipped };
      },
    }),
    [actions, focusStage, latestRef, dispatch],
  );

  const enabledKey = TOOLS.filter((t) => !readOnly && t.isEnabled(state)).map((t) => t.id).join(" ");
  const enabledTools = useMemo(() => new Set(enabledKey.split(" ") as ToolId[]), [enabledKey]);
  const selected = selectedRegion(state) ?? null;
  const visibleSelection = selected && isRegionVisible(state, selected) ? selected : null;
  const lineSelected = selected?.role === "defect" && selected.shape.kind === "line" ? selected.shape : null;
  const rulerWaiting = state.draft?.tool === "ruler" && state.draft.phase === "length";
  const selectedRuler = selected?.role === "ruler" ? selected : null;
  const ruler = useMemo(
    () =>
      rulerWaiting
        ? ({ id: "draft", mode: "draft", lengthMm: null } as const)
        : selectedRuler
          ? ({ id: selectedRuler.id, mode: "selected", lengthMm: selectedRuler.ruler.lengthMm } as const)
          : null,
    [rulerWaiting, selectedRuler],
  );
  const cursor = pointer.panning ? "grabbing" : readOnly ? "grab" : state.activeTool === "select" ? "default" : "crosshair";
  const ready = imageStatus === "ready" && stageSize !== null;

  const regionList = (
    <section aria-labelledby={`${statusId}-regions`} data-testid="region-panel">
      <h2 id={`${statusId}-regions`} className="mb-2 text-sm font-semibold text-gauge-900">
        Regions ({state.regions.length})
      </h2>
      <RegionList regions={state.regions} selectedId={state.selectedId} classes={classByKey} hiddenDefects={state.hiddenDefects} readOnly={readOnly} onSelect={actions.select} onDelete={actions.remove} />
    </section>
  );

  return (
    <div ref={rootRef} className={`flex flex-col gap-3 ${className}`} data-testid="annotation-canvas">
      <Toolbar
        activeTool={state.activeTool}
        enabledTools={enabledTools}
        classes={classes}
        activeDefect={state.activeDefect}
        hiddenDefects={state.hiddenDefects}
        lineWidth={lineSelected ? lineSelected.width : state.lineWidth}
        lineWidthTarget={lineSelected ? "selection" : "new"}
        zoom={state.viewport.scale}
        history={history}
        readOnly={readOnly}
        actions={actions}
      />
      <div className={`flex flex-col gap-3 ${regionListContainer ? "" : "lg:flex-row"}`}>
        <div className="relative min-w-0 flex-1">
          <div
            ref={containerRef}
            tabIndex={0}
            role="application"
            aria-roledescription="annotation canvas"
            aria-label="Photo with marked regions"
            aria-describedby={statusId}
            className="relative h-[65vh] min-h-[360px] w-full overflow-hidden rounded-lg bg-gauge-900 outline-none select-none focus-visible:ring-4 focus-visible:ring-signal-500"
            style={{ touchAction: "none", cursor }}
            {...pointer.handlers}
            data-testid="annotation-stage"
            data-canvas-stage=""
            data-ready={ready ? "true" : "false"}
            data-region-count={state.regions.length}
            data-tool={state.activeTool}
            data-zoom={Math.round(state.viewport.scale * 1e6) / 1e6}
            data-offset-x={Math.round(state.viewport.offsetX * 100) / 100}
            data-offset-y={Math.round(state.viewport.offsetY * 100) / 100}
          >
            {stageSize && (
              <Stage width={stageSize.width} height={stageSize.height} listening={false}>
                <ImageLayer viewport={state.viewport} image={image} original={original} preview={preview} />
                <RegionsLayer viewport={state.viewport} content={content} scene={scene} draggedId={state.drag?.regionId ?? null} />
                <InteractionLayer
                  viewport={state.viewport}
                  draft={state.draft}
                  draftStyle={draftStyleOf(state, styles)}
                  lineWidth={state.lineWidth}
                  selected={visibleSelection}
                  showHandles={!readOnly}
                  ghosts={ghosts}
                  styles={styles}
                />
              </Stage>
            )}
          </div>
          {zones.length > 0 && zoneSource === "image" && (
            // Over the stage, so the photo does not move when the first Surface appears.
            <p className="pointer-events-none absolute right-2 bottom-2 rounded bg-gauge-950/75 px-2 py-1 text-xs text-white" data-testid="zones-waiting">
              Zones: no Surface yet — trace the part with Surface to place them.
            </p>
          )}
          {ruler && !readOnly && (
            // Over the stage, not above it, so the photo does not jump when the prompt opens.
            <div className="card absolute left-2 top-2 z-10 max-w-[calc(100%-1rem)] p-3 shadow-md">
              <RulerLengthInput key={ruler.id} mode={ruler.mode} currentMm={ruler.lengthMm} onApply={actions.rulerLength} onCancel={actions.cancelRuler} />
            </div>
          )}
          <p id={statusId} className="mt-1 min-h-5 text-sm text-gauge-800" aria-live="polite" data-testid="annotation-status">
            {statusText(state, imageStatus, readOnly)}
          </p>
        </div>
        {regionListContainer ? createPortal(regionList, regionListContainer) : <aside className="lg:max-h-[65vh] lg:w-80 lg:overflow-y-auto">{regionList}</aside>}
      </div>
      <ShortcutSheet open={sheetOpen} onClose={() => setSheetOpen(false)} extra={pageShortcuts} />
    </div>
  );
}
