"use client";

import { useCallback, useMemo, useSyncExternalStore, type ReactNode } from "react";
import { Glyph } from "@/components/annotate/tool-glyphs";

export type PanelId = "regions" | "references" | "checklist" | "grade" | "photos";

export type PanelSection = { id: PanelId; title: string; summary?: ReactNode; content: ReactNode };

type PanelState = { folded: boolean; closed: PanelId[] };

const STORAGE_KEY = "partproof.bench.panels";
const DEFAULT_STATE: PanelState = { folded: false, closed: ["references", "photos"] };

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
 * The Bench's side column: regions, reference examples, checklist, measurement and grade, photos — each folds on its
 * header, and the whole column folds away so the photo gets the room: to a narrow strip of
 * section buttons beside it (landscape), or to one row of them under it (portrait, where that row
 * is always there and jumps to a section, since the panels below the photo are short). Panels
 * keep their content mounted while folded (hidden), so a form half filled in or an upload in
 * flight is never lost. `openSection` is how other parts of the Bench bring a panel into view.
 */
export function SidePanels({ sections, state, onChange, className = "" }: { sections: PanelSection[]; state: PanelState; onChange(change: (s: PanelState) => PanelState): void; className?: string }) {
  const toggle = (id: PanelId) => onChange((s) => ({ ...s, closed: s.closed.includes(id) ? s.closed.filter((c) => c !== id) : [...s.closed, id] }));
  const open = (id: PanelId) => openSection(onChange, id);
  return (
    <aside aria-label="Unit panels" className={`flex min-h-0 flex-col gap-2 ${className}`} data-testid="side-panels" data-folded={state.folded ? "true" : "false"}>
      <div className={`flex shrink-0 items-center gap-1 ${state.folded ? "lg:flex-col lg:items-stretch" : "lg:justify-end"}`}>
        <nav aria-label="Panels" className={`flex min-w-0 flex-1 gap-1 overflow-x-auto ${state.folded ? "lg:flex-none lg:flex-col" : "lg:hidden"}`}>
          {sections.map((s) => (
            <button
              key={s.id}
              type="button"
              className="shrink-0 rounded-md border border-gauge-200 bg-white px-2 py-1 text-xs font-medium text-gauge-800 hover:bg-gauge-100 lg:border-0 lg:px-1 lg:py-2 lg:text-[11px] lg:shadow-xs lg:[writing-mode:vertical-rl]"
              onClick={() => open(s.id)}
              data-testid={`jump-${s.id}`}
            >
              {s.title}
            </button>
          ))}
        </nav>
        <button
          type="button"
          className="flex h-8 shrink-0 items-center gap-1.5 rounded-md px-2 text-xs text-gauge-700 hover:bg-gauge-100 lg:order-first lg:self-end"
          aria-expanded={!state.folded}
          onClick={() => onChange((s) => ({ ...s, folded: !s.folded }))}
          data-testid="fold-panels"
          title={state.folded ? "Show the panels" : "Fold the panels away to give the photo more room"}
        >
          <Glyph name="fold" className={`h-4 w-4 ${state.folded ? "-rotate-90 lg:rotate-180" : "rotate-90 lg:rotate-0"}`} />
          <span className={state.folded ? "lg:sr-only" : ""}>{state.folded ? "Show panels" : "Fold panels"}</span>
        </button>
      </div>
      <div className={`relative min-h-0 flex-1 space-y-2 overflow-y-auto pr-0.5 ${state.folded ? "hidden" : ""}`} data-testid="panel-scroller">
        {sections.map((s) => {
          const isOpen = !state.closed.includes(s.id);
          return (
            <section key={s.id} className="rounded-lg border border-gauge-200 bg-white" aria-labelledby={`panel-${s.id}`} data-testid={`panel-${s.id}`} data-section={s.id}>
              <h2 className="text-sm">
                <button
                  type="button"
                  id={`panel-${s.id}`}
                  className="flex w-full items-center gap-2 px-3 py-2 text-left font-semibold text-gauge-900 hover:bg-gauge-50"
                  aria-expanded={isOpen}
                  aria-controls={`panel-${s.id}-body`}
                  onClick={() => toggle(s.id)}
                >
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

/**
 * Unfolds the column, opens the section and scrolls the panels (only them: scrollIntoView could
 * also scroll the workspace's own clipped frame) so the section's header is at the top.
 */
export function openSection(onChange: (change: (s: PanelState) => PanelState) => void, id: PanelId) {
  onChange((s) => ({ folded: false, closed: s.closed.filter((c) => c !== id) }));
  requestAnimationFrame(() => {
    const area = document.querySelector<HTMLElement>("[data-testid=panel-scroller]");
    const section = area?.querySelector<HTMLElement>(`[data-section="${id}"]`);
    if (area && section) area.scrollTop = section.offsetTop;
  });
}
