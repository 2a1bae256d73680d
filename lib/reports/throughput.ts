/**
 * Inspector throughput (issue 17, Reports): units graded per day and median minutes per unit by
 * part type, per inspector and for the desk. Pure.
 *
 * What it expects: one row per inspection grade in the period (100 000 rows sort in well under a
 * second here; `npm run bench -- scoring` prints the time), with the unit's bench minutes already
 * worked out by bench-time.ts's rule (`minutes`: everyone's sessions on the unit; `graderMinutes`:
 * the grader's own), null where unknown.
 *
 * Decisions:
 * - Units per day = units graded ÷ days worked, a day worked being a local day (workspace time
 *   zone) on which the inspector graded at least one unit — not calendar days, which would mix
 *   in weekends and days off. The desk's figure uses the days on which anyone graded.
 * - Median minutes, per part type over all its units (`minutes`), per inspector and part type over
 *   the units they graded (`graderMinutes`, their own time on them). The median of an even count
 *   is the mean of the two middle values, as PostgreSQL's percentile_cont(0.5) gives (a,
 *   PostgreSQL manual, aggregate functions). Units whose minutes are unknown are left out of the
 *   median and counted in `untimed`; NaN when no unit was timed.
 * - Rows whose grade falls outside [from, to] (local days) are ignored.
 */
import { localDate, parseDateKey } from "@/lib/time/periods";

export type ThroughputRow = { graderId: string; partTypeId: string; gradedAt: Date | string | number; minutes: number | null; graderMinutes: number | null };
export type MinutesFigure = { units: number; timed: number; untimed: number; medianMinutes: number };
export type InspectorThroughput = { graderId: string; units: number; daysWorked: number; unitsPerDay: number; medianMinutes: number; byPartType: ({ partTypeId: string } & MinutesFigure)[] };
export type ThroughputReport = {
  inspectors: InspectorThroughput[];
  partTypes: ({ partTypeId: string } & MinutesFigure)[];
  desk: { units: number; daysWorked: number; unitsPerDay: number };
};

/** Median of the numbers (they are sorted in place). NaN for none. */
export function median(values: Float64Array): number {
  if (values.length === 0) return Number.NaN;
  values.sort();
  const middle = values.length >> 1;
  return values.length % 2 === 1 ? values[middle] : (values[middle - 1] + values[middle]) / 2;
}

class MinutesList {
  units = 0;
  private values: number[] = [];
  add(minutes: number | null) {
    this.units++;
    if (minutes === null) return;
    if (!(minutes >= 0) || !Number.isFinite(minutes)) throw new RangeError(`Bench minutes are a number >= 0 or null, got ${minutes}.`);
    this.values.push(minutes);
  }
  figure(): MinutesFigure {
    return { units: this.units, timed: this.values.length, untimed: this.units - this.values.length, medianMinutes: median(Float64Array.from(this.values)) };
  }
}

const byKey = <T>(map: Map<string, T>) => [...map].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));

export function inspectorThroughput(rows: readonly ThroughputRow[], range: { from: string; to: string; timeZone: string }): ThroughputReport {
  const fromMs = parseDateKey(range.from);
  const toMs = parseDateKey(range.to);
  const inspectors = new Map<string, { days: Set<string>; all: MinutesList; partTypes: Map<string, MinutesList> }>();
  const partTypes = new Map<string, MinutesList>();
  const deskDays = new Set<string>();
  let units = 0;
  for (const row of rows) {
    const day = localDate(row.gradedAt, range.timeZone);
    const dayMs = parseDateKey(day);
    if (dayMs < fromMs || dayMs > toMs) continue;
    units++;
    deskDays.add(day);
    let inspector = inspectors.get(row.graderId);
    if (!inspector) inspectors.set(row.graderId, (inspector = { days: new Set(), all: new MinutesList(), partTypes: new Map() }));
    inspector.days.add(day);
    inspector.all.add(row.graderMinutes);
    let own = inspector.partTypes.get(row.partTypeId);
    if (!own) inspector.partTypes.set(row.partTypeId, (own = new MinutesList()));
    own.add(row.graderMinutes);
    let partType = partTypes.get(row.partTypeId);
    if (!partType) partTypes.set(row.partTypeId, (partType = new MinutesList()));
    partType.add(row.minutes);
  }
  return {
    inspectors: byKey(inspectors).map(([graderId, inspector]) => ({
      graderId,
      units: inspector.all.units,
      daysWorked: inspector.days.size,
      unitsPerDay: inspector.all.units / inspector.days.size,
      medianMinutes: inspector.all.figure().medianMinutes,
      byPartType: byKey(inspector.partTypes).map(([partTypeId, list]) => ({ partTypeId, ...list.figure() })),
    })),
    partTypes: byKey(partTypes).map(([partTypeId, list]) => ({ partTypeId, ...list.figure() })),
    desk: { units, daysWorked: deskDays.size, unitsPerDay: deskDays.size === 0 ? Number.NaN : units / deskDays.size },
  };
}
