"use client";

/**
 * The workspace's time zone for client components (server components read it from the session
 * user). Set once by the signed-in layout; format with lib/time/format.ts.
 */
import { createContext, useContext } from "react";
import { DEFAULT_TIME_ZONE, formatDateTime } from "@/lib/time/format";

const TimeZoneContext = createContext(DEFAULT_TIME_ZONE);

export function TimeZoneProvider({ timeZone, children }: { timeZone: string; children: React.ReactNode }) {
  return <TimeZoneContext.Provider value={timeZone}>{children}</TimeZoneContext.Provider>;
}

export const useTimeZone = () => useContext(TimeZoneContext);

/** "2026-11-28 09:10" in the workspace's zone, or "—" for no time. */
export function useDateTime(): (at: string | Date | null | undefined) => string {
  const timeZone = useTimeZone();
  return (at) => (at ? formatDateTime(at, timeZone) : "—");
}
