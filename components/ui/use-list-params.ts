"use client";

import { usePathname, useSearchParams } from "next/navigation";
import { useCallback, useMemo } from "react";
import type { z } from "zod";
import { defaultParams, listParamsSearch, readListParams, type AllowedValues, type ParamValues } from "@/lib/url-state/list-params";

export type HistoryMode = "push" | "replace";

/**
 * After paging from a pager below a long list the window would stay at its bottom: bring the
 * list's top into view when it is above the window.
 */
export function revealTop(element: HTMLElement | null) {
  if (element && element.getBoundingClientRect().top < 0) element.scrollIntoView({ block: "start" });
}

/**
 * A list screen's state, read from the URL (`useSearchParams`) with the schema its server page
 * uses. Changes write the URL with the History API, which the App Router follows
 * (`useSearchParams` updates, back and forward restore) without asking the server to render the
 * page again: the list's own query fetches the new page. Selects, sort and pages push an entry
 * (the back button undoes them); typing in a search box replaces it.
 *
 * `pageKeys` are reset to their defaults whenever a filter changes (`setFilters`), so a narrower
 * filter never opens on a page that no longer exists, and when a link's filter is left out.
 */
export function useListParams<T extends ParamValues>(schema: z.ZodType<T>, options: { allowed?: AllowedValues<T>; pageKeys?: readonly (keyof T)[] } = {}) {
  const searchParams = useSearchParams();
  const pathname = usePathname();
  const { allowed, pageKeys } = options;
  const { params, ignored } = useMemo(() => readListParams(schema, new URLSearchParams(searchParams.toString()), { allowed, pageKeys }), [schema, searchParams, allowed, pageKeys]);

  const hrefFor = useCallback((next: T) => `${pathname}${listParamsSearch(schema, next)}`, [pathname, schema]);
  const go = useCallback(
    (patch: Partial<T>, mode: HistoryMode = "push") => {
      // Start from the URL as it is now, not from this render's params: the router applies a
      // URL change in a transition, and a second change made before it lands (two quick clicks)
      // would otherwise undo the first.
      const { params: current } = readListParams(schema, new URLSearchParams(window.location.search), { allowed, pageKeys });
      const href = `${window.location.pathname}${listParamsSearch(schema, { ...current, ...patch })}`;
      if (href === `${window.location.pathname}${window.location.search}`) return;
      if (mode === "push") window.history.pushState(null, "", href);
      else window.history.replaceState(null, "", href);
    },
    [schema, allowed, pageKeys],
  );
  const setFilters = useCallback(
    (patch: Partial<T>, mode: HistoryMode = "push") => {
      const defaults = defaultParams(schema);
      const reset = Object.fromEntries((pageKeys ?? []).map((k) => [k, defaults[k]])) as Partial<T>;
      go({ ...patch, ...reset }, mode);
    },
    [go, pageKeys, schema],
  );
  /**
   * True when the URL has moved on since this render (the router applies it in a transition):
   * what is on screen (a page's rows, its cursors, its page count) belongs to the previous URL, so
   * paging from it now would open a page of the wrong list.
   */
  const isBehindUrl = useCallback(() => {
    const now = readListParams(schema, new URLSearchParams(window.location.search), { allowed, pageKeys }).params;
    return listParamsSearch(schema, now) !== listParamsSearch(schema, params);
  }, [schema, params, allowed, pageKeys]);
  return { params, ignored, go, setFilters, hrefFor, isBehindUrl };
}
