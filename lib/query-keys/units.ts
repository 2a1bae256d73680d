/**
 * TanStack Query keys of one unit's screens (the Bench, its panels, the photo list). Every key
 * starts with `unitKeys.one(unitId)`; a panel invalidates only its own part (the unit's view after
 * a checklist result, the measurement and grades after measuring), since refetching everything
 * would reload the photos under the inspector's hand.
 */
export const unitKeys = {
  all: ["units"] as const,
  one: (unitId: string) => [...unitKeys.all, unitId] as const,
  /** The Bench's view of the unit: status, lease, lot, checklist results (GET /api/units/:id). */
  view: (unitId: string) => [...unitKeys.one(unitId), "view"] as const,
  photos: (unitId: string) => [...unitKeys.one(unitId), "photos"] as const,
  /** The latest measurement, or a background job's (`jobId`); without a job id, the prefix of both. */
  measurement: (unitId: string, jobId?: string | null) => (jobId === undefined ? ([...unitKeys.one(unitId), "measurement"] as const) : ([...unitKeys.one(unitId), "measurement", jobId] as const)),
  grades: (unitId: string) => [...unitKeys.one(unitId), "grades"] as const,
  /** The unit's condition certificates (leads). */
  certificates: (unitId: string) => [...unitKeys.one(unitId), "certificates"] as const,
  /** The stored measurement graded again under rubric `version`; without a version, the prefix of all. */
  gradePreview: (unitId: string, version?: number | null) =>
    version === undefined ? ([...unitKeys.one(unitId), "grade-preview"] as const) : ([...unitKeys.one(unitId), "grade-preview", version] as const),
};

/**
 * Keys whose queries must never run again because a broader key was invalidated, so they sit
 * under no feature's prefix: the lease heartbeat's query renews the lease (PUT), and a photo's
 * region session opens the autosaver that owns unsaved edits.
 */
export const unitSessionKeys = {
  leaseHeartbeat: (unitId: string) => ["lease-heartbeat", unitId] as const,
  regionSession: (photoId: string) => ["region-session", photoId] as const,
};
