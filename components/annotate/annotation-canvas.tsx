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
import { activateTool, TOOLS, TOOLS_BY_ID, type ShortcutGroup } from "@/lib/annotate/tools";
import type { ToolId } from "@/lib/annotate/types";
import type { PolygonShape } from "@/lib/geometry/shape";
import { edit, useCanvasStore } from "./canvas-store";
import { defectStyleMap } from "@/lib/annotate/class-looks";
import { UNKNOWN_DEFECT_STYLE } from "@/lib/annotate/defect-styles";
import { canvasHint, draftStyleOf } from "./canvas-hint";
import { DefectClassPicker } from "./defect-class-picker";
import { ImageLayer } from "./image-layer";
import { InteractionLayer } from "./interaction-layer";
import { RegionList } from "./region-list";
import { RegionsLayer } from "./regions-layer";
import { ShortcutSheet } from "./shortcut-sheet";
import { StageOverlays } from "./stage-overlays";
import { ToolRail } from "./tool-rail";
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

export function AnnotationCanvas(props: AnnotationCanvasProps) {
  const { handleRef, imageUrl, original, preview, allowedDefects, zones = NO_ZONES, initialRegions, onChange, onHistoryChange, readOnly = false, className = "" } = props;
  const { ghosts = NO_GHOSTS, regionListContainer = null, keyArea = null, autoFocus = false, startWith, onToolChange, pageShortcuts = NO_SHORTCUTS, toolbarEnd = null, classKind } = props;
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
  const {
    minX,
    minY,
    maxX,
    maxY,
    source: zoneSource,
  } = zoneBox(
    state.regions.flatMap((r): PolygonShape[] => (r.role === "surface" ? [r.shape] : [])),
    original,
  );
  // Zones hang on the Surface: before one is traced they would only cover the backdrop.
  const imageZones = useMemo(() => (zoneSource === "surface" ? zonesToImage(zones, { minX, minY, maxX, maxY }) : []), [zones, zoneSource, minX, minY, maxX, maxY]);
  // Regions stay inside the photo; labels and halos may reach a little past its edge.
  const content = useMemo(() => ({ minX: -0.05 * original.width, minY: -0.05 * original.height, maxX: 1.05 * original.width, maxY: 1.05 * original.height }), [original]);
  const scene = useMemo(() => ({ regions: state.regions, hiddenDefects: state.hiddenDefects, styles, zones: imageZones }), [state.regions, state.hiddenDefects, styles, imageZones]);

  const history = useCommittedChanges(state, onChange, onHistoryChange);
  const showShortcuts = useCallback(() => setSheetOpen(true), []);
  const focusStage = useCallback(() => containerRef.current?.focus({ preventScroll: true }), []);
  const actions = useCanvasActions({ dispatch, stageSize, fittedRef, image: original, onShowShortcuts: showShortcuts, focusStage, latestRef, onHandChange: onToolChange });
  useCanvasKeys({ rootRef, alsoIn: [regionListContainer, keyArea], latestRef, dispatch, readOnly, onView: actions.view, spaceHeldRef, onShowShortcuts: showShortcuts, onHandChange: onToolChange });

  // The photo being marked takes the keyboard when it opens (e.g. after a thumbnail click),
  // unless the inspector has moved on to another control meanwhile.
  useEffect(() => {
    if (!autoFocus) return;
    const active = document.activeElement;
    if (!active || active === document.body || keyArea?.contains(active)) focusStage();
  }, [autoFocus, keyArea, focusStage]);

  // Tell the page which tool and class are in hand, so the next photo opens with the same ones
  // (keys and buttons also tell it at once, in their own event: hand.ts).
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

  const enabledKey = TOOLS.filter((t) => !readOnly && t.isEnabled(state))
    .map((t) => t.id)
    .join(" ");
  const enabledTools = useMemo(() => new Set(enabledKey.split(" ") as ToolId[]), [enabledKey]);
  const selected = selectedRegion(state) ?? null;
  const visibleSelection = selected && isRegionVisible(state, selected) ? selected : null;
  const lineSelected = selected?.role === "defect" && selected.shape.kind === "line" ? selected.shape : null;
  const lineWidthValue = lineSelected ? lineSelected.width : state.lineWidth;
  const lineWidth = useMemo(() => ({ value: lineWidthValue, target: lineSelected ? ("selection" as const) : ("new" as const) }), [lineWidthValue, lineSelected]);
  const rulerWaiting = state.draft?.tool === "ruler" && state.draft.phase === "length";
  const selectedRuler = selected?.role === "ruler" ? selected : null;
  const ruler = useMemo(
    () =>
      rulerWaiting ? ({ id: "draft", mode: "draft", lengthMm: null } as const) : selectedRuler ? ({ id: selectedRuler.id, mode: "selected", lengthMm: selectedRuler.ruler.lengthMm } as const) : null,
    [rulerWaiting, selectedRuler],
  );
  const cursor = pointer.panning ? "grabbing" : readOnly ? "grab" : state.activeTool === "select" ? "default" : "crosshair";
  const ready = imageStatus === "ready" && stageSize !== null;

  const regionList = (
    <section aria-labelledby={`${statusId}-regions`} data-testid="region-panel">
      <h3 id={`${statusId}-regions`} className="mb-1.5 text-xs font-medium text-gauge-700">
        {state.regions.length === 1 ? "1 region" : `${state.regions.length} regions`} on this photo
      </h3>
      <RegionList
        regions={state.regions}
        selectedId={state.selectedId}
        classes={classByKey}
        hiddenDefects={state.hiddenDefects}
        readOnly={readOnly}
        onSelect={actions.select}
        onDelete={actions.remove}
      />
    </section>
  );

  const inHand = readOnly ? null : { id: state.activeTool, label: TOOLS_BY_ID[state.activeTool].label };
  const entryInHand =
    !readOnly && state.activeDefect && state.activeTool !== "surface" && state.activeTool !== "ruler" && state.activeTool !== "select" ? (classByKey.get(state.activeDefect) ?? null) : null;

  return (
    <div ref={rootRef} className={`flex min-h-0 flex-col gap-2 ${className}`} data-testid="annotation-canvas">
      <div className="grid min-h-0 flex-1 grid-cols-[auto_minmax(0,1fr)] grid-rows-[auto_minmax(0,1fr)] gap-x-2 gap-y-1.5">
        <div className="row-span-2">
          <ToolRail
            activeTool={state.activeTool}
            lineWidth={lineWidth}
            enabledTools={enabledTools}
            classes={classes}
            hiddenDefects={state.hiddenDefects}
            history={history}
            readOnly={readOnly}
            actions={actions}
          />
        </div>
        <div className="flex min-h-8 min-w-0 items-start gap-3" data-testid="annotation-toolbar">
          {!readOnly && <DefectClassPicker classes={classes} activeDefect={state.activeDefect} onPick={actions.defect} kind={classKind} />}
          {toolbarEnd && <div className="ml-auto flex shrink-0 items-center">{toolbarEnd}</div>}
        </div>
        <div className="relative min-h-[320px] min-w-0">
          <div
            ref={containerRef}
            tabIndex={0}
            role="application"
            aria-roledescription="annotation canvas"
            aria-label="Photo with marked regions"
            aria-describedby={statusId}
            className="absolute inset-0 overflow-hidden rounded-lg bg-gauge-900 outline-none select-none focus-visible:ring-4 focus-visible:ring-signal-500"
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
          <StageOverlays
            statusId={statusId}
            tool={inHand}
            entry={entryInHand}
            hint={canvasHint(state, imageStatus, readOnly)}
            zoom={state.viewport.scale}
            zonesWaiting={zones.length > 0 && zoneSource === "image"}
            ruler={readOnly ? null : ruler}
            actions={actions}
          />
        </div>
      </div>
      {regionListContainer ? createPortal(regionList, regionListContainer) : <aside className="max-h-64 overflow-y-auto">{regionList}</aside>}
      <ShortcutSheet open={sheetOpen} onClose={() => setSheetOpen(false)} extra={pageShortcuts} />
    </div>
  );
}
