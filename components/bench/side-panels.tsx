"use client";

import { useCallback, useMemo, useSyncExternalStore, type ReactNode } from "react";
import { Glyph } from "@/components/annotate/tool-glyphs";

export type PanelId = "regions" | "checklist" | "grade" | "photos";

export type PanelSection = { id: PanelId; title: string; summary?: ReactNode; content: ReactNode };

type PanelState = { folded: boolean; closed: PanelId[] };

const STORAGE_KEY = "partproof.bench.panels";
const DEFAULT_STATE: PanelState = { folded: false, closed: ["photos"] };

function parsePanelState(raw: string | null): PanelState {
  try {
    const saved = JSON.parse(raw ?? "null") as PanelState | null;
    if (saved && typeof saved.folded === "boolean" && Array.isArray(saved.closed)) return saved;
  } catch {
    // A damaged preference is simply forgotten.
  }
  return DEFAULT_STATE;
}

const listeners = new Set<() => void>();
function subscribe(listener: () => void) {
  listeners.add(listener);
  window.addEventListener("storage", listener);
  return () => {
    listeners.delete(listener);
    window.removeEventListener("storage", listener);
  };
}
const readStored = () => window.localStorage.getItem(STORAGE_KEY);

/**
 * Which panels are open and whether the column is folded, kept per browser (a preference, not
 * data). The server renders the default; the stored choice applies once the page has hydrated.
 */
export function usePanelState(): [PanelState, (change: (s: PanelState) => PanelState) => void] {
  const raw = useSyncExternalStore(subscribe, readStored, () => null);
  const state = useMemo(() => parsePanelState(raw), [raw]);
  const update = useCallback((change: (s: PanelState) => PanelState) => {
    window.localStorage.setItem(STORAGE_KEY, JSON.stringify(change(parsePanelState(readStored()))));
    listeners.forEach((l) => l());
  }, []);
  return [state, update];
}

/**
 * The Bench's side column: checklist, regions, measurement and grade, photos — each folds on
 * its header, and the whole column folds to a narrow strip of section buttons so the canvas can
 * have the width. Panels keep their content mounted while folded (hidden), so a form half filled
 * in or an upload in flight is never lost.
 */
export function SidePanels({ sections, state, onChange, className = "" }: { sections: PanelSection[]; state: PanelState; onChange(change: (s: PanelState) => PanelState): void; className?: string }) {
  const open = (id: PanelId) => onChange((s) => ({ folded: false, closed: s.closed.filter((c) => c !== id) }));
  const toggle = (id: PanelId) => onChange((s) => ({ ...s, closed: s.closed.includes(id) ? s.closed.filter((c) => c !== id) : [...s.closed, id] }));
  return (
    <aside aria-label="Unit panels" className={`flex min-h-0 flex-col gap-2 ${state.folded ? "lg:w-11" : ""} ${className}`} data-testid="side-panels" data-folded={state.folded ? "true" : "false"}>
      <button
        type="button"
        className="hidden h-8 shrink-0 items-center gap-1.5 self-end rounded-md px-2 text-xs text-gauge-700 hover:bg-gauge-100 lg:flex"
        aria-expanded={!state.folded}
        onClick={() => onChange((s) => ({ ...s, folded: !s.folded }))}
        data-testid="fold-panels"
        title={state.folded ? "Show the panels" : "Fold the panels away to widen the photo"}
      >
        <Glyph name="fold" className={`h-4 w-4 ${state.folded ? "rotate-180" : ""}`} />
        <span className={state.folded ? "sr-only" : ""}>Fold panels</span>
      </button>
      {state.folded && (
        <nav aria-label="Panels" className="hidden flex-col gap-1 lg:flex">
          {sections.map((s) => (
            <button key={s.id} type="button" className="rounded-md bg-white px-1 py-2 text-[11px] font-medium text-gauge-800 shadow-xs [writing-mode:vertical-rl] hover:bg-gauge-100" onClick={() => open(s.id)}>
              {s.title}
            </button>
          ))}
        </nav>
      )}
      <div className={`relative min-h-0 flex-1 space-y-2 overflow-y-auto pr-0.5 ${state.folded ? "lg:hidden" : ""}`}>
        {sections.map((s) => {
          const isOpen = !state.closed.includes(s.id);
          return (
            <section key={s.id} className="rounded-lg border border-gauge-200 bg-white" aria-labelledby={`panel-${s.id}`} data-testid={`panel-${s.id}`}>
              <h2 className="text-sm">
                <button type="button" id={`panel-${s.id}`} className="flex w-full items-center gap-2 px-3 py-2 text-left font-semibold text-gauge-900 hover:bg-gauge-50" aria-expanded={isOpen} aria-controls={`panel-${s.id}-body`} onClick={() => toggle(s.id)}>
                  <Glyph name="fold" className={`h-3.5 w-3.5 shrink-0 transition-transform ${isOpen ? "rotate-90" : ""}`} />
                  <span>{s.title}</span>
                  {s.summary && <span className="ml-auto min-w-0 truncate text-xs font-normal text-gauge-700">{s.summary}</span>}
                </button>
              </h2>
              <div id={`panel-${s.id}-body`} hidden={!isOpen} className="border-t border-gauge-100 px-3 pt-2 pb-3">
                {s.content}
              </div>
            </section>
          );
        })}
      </div>
    </aside>
  );
}
