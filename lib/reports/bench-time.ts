/**
 * Minutes a unit spent on the bench before its inspection grade, from its claim history (the
 * activity log: unit.claimed, unit.reassigned, unit.released, unit.lease_expired, and the
 * inspection grade). This is the "minutes per unit" of the inspector throughput report.
 *
 * The rule (ours, c):
 * - A bench session runs from a claim (taking it from the queue, a checklist reading that claims
 *   it, or a lead handing it to someone — `claimed` with the new holder) to the next release,
 *   claim or the grade. Time between a release and the next claim — the unit back in the queue,
 *   "paused" — is not counted. Sessions of everyone who held the unit are summed (`minutes`);
 *   `byPerson` splits them per holder.
 * - A session that ended because its lease ran out has no known end: the log notes the expiry
 *   when the next claim finds it, up to a lease later than the last heartbeat. Such a unit's
 *   minutes are unknown (null, reason "lease_lapsed") rather than guessed; the report says how
 *   many units it could not time.
 * - A grade with no session open (graded straight from the lot page) is "no_session": null. No
 *   grade at all is "not_graded". Events after the first grade (corrections) are ignored.
 * - Limits of the data: the Bench renews the lease while it is open, so an open but idle Bench
 *   counts as bench time; medians (throughput.ts) keep such outliers from moving the figure.
 */
export type BenchEvent = { at: Date | string | number; kind: "claimed" | "released" | "lease_expired" | "graded"; userId?: string | null };
export type BenchTime = { minutes: number | null; byPerson: Record<string, number>; sessions: number; unknown?: "lease_lapsed" | "no_session" | "not_graded" };

const toMs = (at: Date | string | number) => {
  const ms = at instanceof Date ? at.getTime() : typeof at === "number" ? at : Date.parse(at);
  if (!Number.isFinite(ms)) throw new RangeError(`Not a valid time: ${String(at)}.`);
  return ms;
};

export function benchTime(events: readonly BenchEvent[]): BenchTime {
  // Stable sort: events logged in the same instant keep the order they were given in.
  const ordered = events.map((event, index) => ({ event, ms: toMs(event.at), index })).sort((a, b) => a.ms - b.ms || a.index - b.index);
  const byPerson = new Map<string, number>();
  let open: { userId: string; since: number } | null = null;
  let sessions = 0;
  let lapsed = false;
  const close = (until: number) => {
    if (!open) return;
    byPerson.set(open.userId, (byPerson.get(open.userId) ?? 0) + (until - open.since) / 60_000);
    sessions++;
    open = null;
  };
  for (const { event, ms } of ordered) {
    if (event.kind === "claimed") {
      if (!event.userId) throw new RangeError("A claim names who took the unit (userId).");
      close(ms);
      open = { userId: event.userId, since: ms };
    } else if (event.kind === "released") {
      close(ms);
    } else if (event.kind === "lease_expired") {
      if (open) lapsed = true;
      open = null;
    } else if (event.kind === "graded") {
      const hadSession = open !== null;
      close(ms);
      const result = { byPerson: Object.fromEntries(byPerson), sessions };
      if (lapsed) return { ...result, minutes: null, unknown: "lease_lapsed" };
      if (!hadSession) return { ...result, minutes: null, unknown: "no_session" };
      return { ...result, minutes: [...byPerson.values()].reduce((sum, minutes) => sum + minutes, 0) };
    } else {
      throw new RangeError(`Unknown bench event ${JSON.stringify((event as BenchEvent).kind)}.`);
    }
  }
  return { minutes: null, byPerson: Object.fromEntries(byPerson), sessions, unknown: "not_graded" };
}
