/**
 * Moving between a unit's photos from the keyboard: PageDown or "." opens the next ready photo,
 * PageUp or "," the previous one, wrapping round at the ends. The keys count where the canvas's
 * keys count (the marking area, or nothing focused) and never inside a form field. Pure parts
 * first, the browser hook last.
 */
import { useEffect, useRef } from "react";
import { canvasTakesKey, describeKeyTarget } from "@/components/annotate/key-scope";
import type { Shortcut } from "@/lib/annotate/tools";

export const PHOTO_SHORTCUTS: readonly Shortcut[] = [
  { keys: "PageDown or .", action: "Next photo of the unit" },
  { keys: "PageUp or ,", action: "Previous photo of the unit" },
];

export function photoStepForKey(input: Readonly<{ key: string; shift: boolean; alt: boolean; mod: boolean }>): 1 | -1 | null {
  if (input.mod || input.alt) return null;
  if (input.key === "PageDown" || input.key === ".") return 1;
  if (input.key === "PageUp" || input.key === ",") return -1;
  return null;
}

/** The photo `step` places along from `currentId` (the first one when nothing is open yet). */
export function steppedPhotoId(ids: readonly string[], currentId: string | null, step: 1 | -1): string | null {
  if (ids.length === 0) return null;
  const at = currentId === null ? -1 : ids.indexOf(currentId);
  if (at < 0) return ids[step > 0 ? 0 : ids.length - 1];
  return ids[(at + step + ids.length) % ids.length];
}

type PhotoKeyOptions = {
  /** Where the keys count besides an unfocused page (the marking area). */
  area: HTMLElement | null;
  ids: readonly string[];
  currentId: string | null;
  onOpen(id: string): void;
};

export function usePhotoKeys(options: PhotoKeyOptions): void {
  const ref = useRef(options);
  useEffect(() => {
    ref.current = options;
  });
  useEffect(() => {
    function onKeyDown(e: KeyboardEvent) {
      const { area, ids, currentId, onOpen } = ref.current;
      const target = e.target;
      const inArea = target === document.body || target === document.documentElement || (target instanceof Node && Boolean(area?.contains(target)));
      if (e.defaultPrevented || e.isComposing || !inArea || !canvasTakesKey(describeKeyTarget(target), e.key)) return;
      const step = photoStepForKey({ key: e.key, shift: e.shiftKey, alt: e.altKey, mod: e.ctrlKey || e.metaKey });
      if (step === null) return;
      e.preventDefault(); // PageDown would scroll the page
      const next = steppedPhotoId(ids, currentId, step);
      if (next && next !== currentId) onOpen(next);
    }
    document.addEventListener("keydown", onKeyDown);
    return () => document.removeEventListener("keydown", onKeyDown);
  }, []);
}
