"use client";

import { useSyncExternalStore } from "react";

const noSubscription = () => () => {};

/**
 * False in the server's HTML and until React has attached its handlers, true after. Controls
 * whose input would be lost before then (a file picked while the page is still loading) stay
 * disabled until it turns true.
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}
