/** Minutes until the oldest failure inside the window expires (at least 1). */
export function minutesUntilRetry(oldestFailure: Date, now: Date, windowMinutes: number): number {
  const freeAt = oldestFailure.getTime() + windowMinutes * 60_000;
  return Math.max(1, Math.ceil((freeAt - now.getTime()) / 60_000));
}
