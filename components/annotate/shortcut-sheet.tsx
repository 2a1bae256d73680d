"use client";

import { useEffect, useRef, type KeyboardEvent } from "react";
import { shortcutSheet, type ShortcutGroup } from "@/lib/annotate/tools";
import { VIEW_SHORTCUTS } from "./view-commands";

const GROUPS = [...shortcutSheet(), { title: "View", shortcuts: VIEW_SHORTCUTS }];

/**
 * The `?` sheet: every key of the canvas, from the tool registry plus the view keys (and the
 * page's own, `extra`, e.g. the Bench's photo keys). A modal
 * dialog: focus moves into it, Tab stays inside, Escape or the button closes it, and focus goes
 * back to where it was.
 */
export function ShortcutSheet({ open, onClose, extra = [] }: { open: boolean; onClose(): void; extra?: readonly ShortcutGroup[] }) {
  const dialogRef = useRef<HTMLDivElement>(null);
  const closeRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!open) return;
    const previous = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    closeRef.current?.focus();
    return () => previous?.focus({ preventScroll: true });
  }, [open]);

  if (!open) return null;

  function onKeyDown(e: KeyboardEvent<HTMLDivElement>) {
    // Keys pressed in the sheet never reach the canvas behind it.
    e.stopPropagation();
    if (e.key === "Escape") {
      e.preventDefault();
      onClose();
      return;
    }
    if (e.key !== "Tab" || !dialogRef.current) return;
    const focusable = dialogRef.current.querySelectorAll<HTMLElement>('button, [href], [tabindex]:not([tabindex="-1"])');
    const first = focusable[0];
    const last = focusable[focusable.length - 1];
    if (e.shiftKey && document.activeElement === first) {
      e.preventDefault();
      last.focus();
    } else if (!e.shiftKey && document.activeElement === last) {
      e.preventDefault();
      first.focus();
    }
  }

  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-gauge-950/50 p-4" onClick={onClose}>
      <div
        ref={dialogRef}
        role="dialog"
        aria-modal="true"
        aria-labelledby="shortcut-sheet-title"
        className="card max-h-[85vh] w-full max-w-3xl overflow-y-auto p-5"
        onClick={(e) => e.stopPropagation()}
        onKeyDown={onKeyDown}
        data-testid="shortcut-sheet"
      >
        <div className="mb-3 flex items-center justify-between gap-4">
          <h2 id="shortcut-sheet-title" className="text-lg font-semibold">
            Keyboard and pointer shortcuts
          </h2>
          <button ref={closeRef} type="button" className="btn-secondary min-h-10" onClick={onClose}>
            Close <kbd className="font-mono text-xs opacity-70">Esc</kbd>
          </button>
        </div>
        <div className="grid gap-x-8 gap-y-4 sm:grid-cols-2">
          {[...GROUPS, ...extra].map((group) => (
            <section key={group.title} aria-labelledby={`shortcuts-${group.title}`}>
              <h3 id={`shortcuts-${group.title}`} className="mb-1 text-sm font-semibold text-gauge-800">
                {group.title}
              </h3>
              <dl className="grid grid-cols-[9.5rem_1fr] gap-x-3 gap-y-1 text-sm">
                {group.shortcuts.map((s) => (
                  <div key={`${s.keys}-${s.action}`} className="contents">
                    <dt className="font-mono text-xs leading-5 break-words text-gauge-900">{s.keys}</dt>
                    <dd className="text-gauge-800">{s.action}</dd>
                  </div>
                ))}
              </dl>
            </section>
          ))}
        </div>
      </div>
    </div>
  );
}
