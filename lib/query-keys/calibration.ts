/**
 * TanStack Query keys of Calibration, from this one factory (never bare strings). A taker's
 * measurement is keyed on when the answer was saved: a new save is measured again, an unchanged
 * answer is not.
 */
export const calibrationKeys = {
  all: ["calibration"] as const,
  attempt: (attemptId: string) => [...calibrationKeys.all, "attempt", attemptId] as const,
  measurement: (attemptId: string, position: number, savedAt: string) => [...calibrationKeys.attempt(attemptId), "measurement", position, savedAt] as const,
};
