/**
 * One rule for times: every time is shown in the workspace's time zone (a setting, IANA name),
 * 24-hour, ISO-style date — "2026-11-28 09:10" — and the zone is named once on the page (in the
 * app's frame), not after every time. Documents that leave the app (PDFs, e-mails) name the zone
 * with each time (`formatInstant`), since nothing around them says it. Browser-safe and pure.
 */

export const DEFAULT_TIME_ZONE = "UTC";

/** Whether the runtime knows `timeZone` as an IANA zone name. */
export function isValidTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat("en-GB", { timeZone });
    return true;
  } catch {
    return false;
  }
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function partsOf(at: Date | string | number, timeZone: string) {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat("en-GB", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit", hourCycle: "h23" });
    formatters.set(timeZone, formatter);
  }
  const parts = formatter.formatToParts(at instanceof Date ? at : new Date(at));
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? "";
  return { date: `${part("year")}-${part("month")}-${part("day")}`, time: `${part("hour")}:${part("minute")}`, seconds: part("second") };
}

/** "2026-11-28" in the zone. */
export const formatDate = (at: Date | string | number, timeZone: string) => partsOf(at, timeZone).date;

/** "09:10" (or "09:10:05") in the zone. */
export function formatTime(at: Date | string | number, timeZone: string, options: { seconds?: boolean } = {}) {
  const p = partsOf(at, timeZone);
  return options.seconds ? `${p.time}:${p.seconds}` : p.time;
}

/** "2026-11-28 09:10" in the zone. */
export function formatDateTime(at: Date | string | number, timeZone: string) {
  const p = partsOf(at, timeZone);
  return `${p.date} ${p.time}`;
}

/** "2026-11-28 09:10 Europe/Berlin": for documents read outside the app, the zone with the time. */
export const formatInstant = (at: Date | string | number, timeZone: string) => `${formatDateTime(at, timeZone)} ${timeZone}`;

/** "Europe/Berlin (UTC+01:00 now)": how the setting is named on screen. */
export function describeTimeZone(timeZone: string, now = new Date()): string {
  const offset = new Intl.DateTimeFormat("en-GB", { timeZone, timeZoneName: "longOffset" }).formatToParts(now).find((p) => p.type === "timeZoneName")?.value ?? "";
  const normalised = offset === "GMT" ? "UTC+00:00" : offset.replace("GMT", "UTC");
  return timeZone === "UTC" ? "UTC" : `${timeZone} (${normalised} now)`;
}
