"use client";

import { useEffect, useState } from "react";

/** Typing waits this long before the list follows, so each keystroke is not a request. */
export const SEARCH_DELAY_MS = 300;

/**
 * A search box over a list whose search lives in the URL: the box holds what is typed, `commit`
 * runs once typing pauses (callers replace the history entry, so back leaves the list rather than
 * stepping through keystrokes), and the box follows the URL when it changes from outside (back,
 * forward, a link).
 */
export function useSearchBox(inUrl: string | undefined, commit: (value: string | undefined) => void): [string, (text: string) => void] {
  const [text, setText] = useState(inUrl ?? "");
  const [seen, setSeen] = useState(inUrl);
  if (inUrl !== seen) {
    setSeen(inUrl);
    setText(inUrl ?? "");
  }
  useEffect(() => {
    const wanted = text.trim();
    if (wanted === (inUrl ?? "")) return;
    const timer = setTimeout(() => commit(wanted || undefined), SEARCH_DELAY_MS);
    return () => clearTimeout(timer);
  }, [text, inUrl, commit]);
  return [text, setText];
}
