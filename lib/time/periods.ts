/**
 * Calendar periods in the workspace's time zone (the one time rule, lib/time/format.ts): the local
 * date of an instant, and the day, week or month it belongs to, as "YYYY-MM-DD" keys (a week is
 * named by its Monday, ISO 8601 — the same as PostgreSQL's `date_trunc('week', …)`; a month by its
 * first day). Reports and scorecards bucket by these keys, so a grade at 00:30 on a Monday in
 * Berlin counts in Berlin's week, not in the UTC week before it. Pure, browser-safe.
 *
 * Speed: `Intl.DateTimeFormat` costs microseconds per call, too slow for 100 000 rows. The zone's
 * UTC offset is looked up once per UTC day (at its first and last millisecond) and reused for
 * every instant of that day; only a day on which the offset changes (a daylight-saving switch) is
 * formatted instant by instant. This is exact as long as a zone changes its offset at most once
 * in a UTC day, which holds for the zones in use (c). Date keys are memoised both ways (day
 * number ↔ "YYYY-MM-DD"), since a report's rows fall on a few hundred distinct days.
 */

export type PeriodUnit = "day" | "week" | "month";

const DAY_MS = 86_400_000;
const DATE_KEY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Memo caches are cleared when they reach this size (a bound, never reached by one report). */
const CACHE_LIMIT = 100_000;
const offsetFormatters = new Map<string, Intl.DateTimeFormat>();
/** UTC day number (days since 1970-01-01) → "YYYY-MM-DD", and valid keys → their UTC midnight. */
const keysOfDays = new Map<number, string>();
const daysOfKeys = new Map<string, number>();
/** Per zone: UTC day number → offset in ms for that whole day, or null when it changes that day. */
const dayOffsets = new Map<string, Map<number, number | null>>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = offsetFormatters.get(timeZone);
  if (!formatter) {
    // Throws a RangeError for an unknown zone, which is what callers should see.
    formatter = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", year: "numeric", month: "numeric", day: "numeric", hour: "numeric", minute: "numeric", second: "numeric" });
    offsetFormatters.set(timeZone, formatter);
  }
  return formatter;
}

/** The zone's offset from UTC at `ms`, in ms (local wall clock minus UTC). */
function offsetAt(ms: number, timeZone: string): number {
  const parts = formatterFor(timeZone).formatToParts(new Date(ms));
  const get = (type: Intl.DateTimeFormatPartTypes) => Number(parts.find((part) => part.type === type)?.value);
  const wall = Date.UTC(get("year"), get("month") - 1, get("day"), get("hour"), get("minute"), get("second"));
  return wall - (ms - (((ms % 1000) + 1000) % 1000));
}

function toMs(at: Date | string | number): number {
  const ms = at instanceof Date ? at.getTime() : typeof at === "number" ? at : Date.parse(at);
  if (!Number.isFinite(ms)) throw new RangeError(`Not a valid instant: ${String(at)}.`);
  return ms;
}

function keyOfDay(day: number): string {
  let key = keysOfDays.get(day);
  if (key === undefined) {
    key = new Date(day * DAY_MS).toISOString().slice(0, 10);
    if (keysOfDays.size >= CACHE_LIMIT) keysOfDays.clear();
    keysOfDays.set(day, key);
  }
  return key;
}

const dateKeyOfUtcMs = (ms: number): string => keyOfDay(Math.floor(ms / DAY_MS));

/** The local calendar date ("YYYY-MM-DD") of an instant in `timeZone`. */
export function localDate(at: Date | string | number, timeZone: string): string {
  const ms = toMs(at);
  const day = Math.floor(ms / DAY_MS);
  let zone = dayOffsets.get(timeZone);
  if (!zone) {
    formatterFor(timeZone);
    zone = new Map();
    dayOffsets.set(timeZone, zone);
  }
  let offset = zone.get(day);
  if (offset === undefined) {
    const first = offsetAt(day * DAY_MS, timeZone);
    const last = offsetAt(day * DAY_MS + DAY_MS - 1, timeZone);
    offset = first === last ? first : null;
    zone.set(day, offset);
  }
  return dateKeyOfUtcMs(ms + (offset ?? offsetAt(ms, timeZone)));
}

/** Checks a "YYYY-MM-DD" key and returns its UTC midnight in ms. */
export function parseDateKey(date: string): number {
  const known = daysOfKeys.get(date);
  if (known !== undefined) return known;
  const match = DATE_KEY.exec(date);
  const ms = match ? Date.UTC(Number(match[1]), Number(match[2]) - 1, Number(match[3])) : Number.NaN;
  if (!match || !Number.isFinite(ms) || dateKeyOfUtcMs(ms) !== date) throw new RangeError(`Not a calendar date (YYYY-MM-DD): ${JSON.stringify(date)}.`);
  if (daysOfKeys.size >= CACHE_LIMIT) daysOfKeys.clear();
  daysOfKeys.set(date, ms);
  return ms;
}

/** The period a local date belongs to: the date itself, its week's Monday, or its month's first day. */
export function periodOfDate(date: string, unit: PeriodUnit): string {
  const ms = parseDateKey(date);
  if (unit === "day") return date;
  if (unit === "month") return `${date.slice(0, 7)}-01`;
  const day = ms / DAY_MS;
  const weekday = (((day + 3) % 7) + 7) % 7; // Monday 0 … Sunday 6 (1970-01-01 was a Thursday)
  return keyOfDay(day - weekday);
}

/** The period of an instant in the zone. */
export const periodOf = (at: Date | string | number, unit: PeriodUnit, timeZone: string): string => periodOfDate(localDate(at, timeZone), unit);

/** The period after `period` (a key as periodOfDate returns). */
export function nextPeriod(period: string, unit: PeriodUnit): string {
  const ms = parseDateKey(period);
  if (unit === "day") return dateKeyOfUtcMs(ms + DAY_MS);
  if (unit === "week") return dateKeyOfUtcMs(ms + 7 * DAY_MS);
  const date = new Date(ms);
  return dateKeyOfUtcMs(Date.UTC(date.getUTCFullYear(), date.getUTCMonth() + 1, 1));
}

/** Every period from the one holding `from` to the one holding `to` (local dates, both included). */
export function periodsBetween(from: string, to: string, unit: PeriodUnit): string[] {
  if (parseDateKey(from) > parseDateKey(to)) throw new RangeError(`The period starts (${from}) after it ends (${to}).`);
  const last = periodOfDate(to, unit);
  const periods: string[] = [];
  for (let period = periodOfDate(from, unit); period <= last; period = nextPeriod(period, unit)) periods.push(period);
  return periods;
}

const MONTH_ABBREVIATIONS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;

/** A month period ("2026-11-01", or any date of that month) as people read it: "Nov 2026". */
export function monthLabel(period: string): string {
  parseDateKey(period);
  return `${MONTH_ABBREVIATIONS[Number(period.slice(5, 7)) - 1]} ${period.slice(0, 4)}`;
}
