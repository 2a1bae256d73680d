/**
 * When a stored measurement is no longer the unit's current one. A measurement records what it
 * read: each photo's region set version and the time of the latest checklist result. It is
 * stale as soon as any of that differs from now — a region saved, a photo added or removed or
 * filed under another view (its zones change), a checklist item re-recorded — and a stale result
 * is never shown or graded as current.
 */
export type MeasuredInputs = {
  /** Photo id → region set version. */
  regionsVersions: Readonly<Record<string, number>>;
  /** ISO time of the latest checklist result, or null when there was none. */
  checklistStamp: string | null;
  /** Photo id → view key (its zones); compared only when both sides have it. */
  views?: Readonly<Record<string, string>>;
};

export type Staleness = { stale: boolean; reasons: string[] };

/** Reasons why `measured` is not `current`, as sentences; none means current. */
export function measurementStaleness(measured: MeasuredInputs, current: MeasuredInputs, photoName: (photoId: string) => string = (id) => `Photo ${id.slice(0, 8)}`): Staleness {
  const reasons: string[] = [];
  for (const [photoId, version] of Object.entries(measured.regionsVersions)) {
    const now = current.regionsVersions[photoId];
    if (now === undefined) reasons.push(`${photoName(photoId)} was measured but is no longer part of the unit.`);
    else if (now !== version) reasons.push(`${photoName(photoId)}: regions changed since measuring (version ${version} → ${now}).`);
    const [viewThen, viewNow] = [measured.views?.[photoId], current.views?.[photoId]];
    if (now !== undefined && viewThen !== undefined && viewNow !== undefined && viewThen !== viewNow)
      reasons.push(`${photoName(photoId)}: filed under another view since measuring (${viewThen} → ${viewNow}).`);
  }
  for (const photoId of Object.keys(current.regionsVersions)) {
    if (!(photoId in measured.regionsVersions)) reasons.push(`${photoName(photoId)} was added after measuring.`);
  }
  if (measured.checklistStamp !== current.checklistStamp) reasons.push("Checklist results changed since measuring.");
  return { stale: reasons.length > 0, reasons };
}

/** Time stamps compare as ISO strings; Date values from the database are normalised here. */
export const checklistStampOf = (latest: Date | string | null | undefined): string | null => (latest === null || latest === undefined ? null : new Date(latest).toISOString());
