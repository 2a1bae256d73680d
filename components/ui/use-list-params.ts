"use client";

import { usePathname, useSearchParams } from "next/navigation";
import { useCallback, useMemo } from "react";
import type { z } from "zod";
import { defaultParams, listParamsSearch, readListParams, type AllowedValues, type ParamValues } from "@/lib/url-state/list-params";

export type HistoryMode = "push" | "replace";

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
      const href = hrefFor({ ...params, ...patch });
      if (href === `${window.location.pathname}${window.location.search}`) return;
      if (mode === "push") window.history.pushState(null, "", href);
      else window.history.replaceState(null, "", href);
    },
    [hrefFor, params],
  );
  const setFilters = useCallback(
    (patch: Partial<T>, mode: HistoryMode = "push") => {
      const defaults = defaultParams(schema);
      const reset = Object.fromEntries((pageKeys ?? []).map((k) => [k, defaults[k]])) as Partial<T>;
      go({ ...patch, ...reset }, mode);
    },
    [go, pageKeys, schema],
  );
  return { params, ignored, go, setFilters, hrefFor };
}
