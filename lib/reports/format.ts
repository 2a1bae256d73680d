/** Small formatters shared by the report templates (PDF text and e-mail bodies). */
import { DEFAULT_TIME_ZONE, formatInstant as formatInstantIn } from "@/lib/time/format";

/** "2026-12-01 14:05 UTC" — an instant in the workspace's time zone (UTC when none is given), named with it: a document is read outside the app. */
export const formatInstant = (date: Date, timeZone = DEFAULT_TIME_ZONE): string => formatInstantIn(date, timeZone);

/** "1.0" / "0.65" as printed in AQL tables; null AQL for critical means zero acceptance. */
export const formatAql = (aql: number | null) => (aql === null ? "0 (none accepted)" : String(aql));

/** Share 0..1 as "12.5 %". */
export const formatShare = (share: number) => `${(share * 100).toFixed(1)} %`;

export const GRADE_CAUTION = "Grades are decision aids: company policy, supplier contracts and local regulations decide. Standards tables in Partproof are summaries; the licensed standard governs.";
