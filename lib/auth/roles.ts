/** The four roles; a user may hold several. "lead" may do everything the others may. */
export const ROLES = ["inspector", "trainer", "auditor", "lead"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  inspector: "Inspector",
  trainer: "Trainer",
  auditor: "Auditor",
  lead: "QC lead",
};

/** True when the user holds one of the wanted roles; leads pass every check. */
export function hasAnyRole(userRoles: readonly Role[], wanted: Role | readonly Role[] | undefined): boolean {
  if (wanted === undefined) return true;
  const list: readonly Role[] = typeof wanted === "string" ? [wanted] : wanted;
  if (list.length === 0) return true;
  return userRoles.includes("lead") || list.some((r) => userRoles.includes(r));
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

/**
 * Who may read a unit's inspection work: its photos' details, regions, measurements, proposals,
 * grades and the Bench that shows them (leads pass every check). Not auditors: a blind recheck
 * must not see the first grader's regions, grade, override reason or name; they will see graded
 * work on the Recheck screens, after their own grade. Not trainers yet: nothing they do today
 * reads a real unit (the Rubrics preview grades typed sample readings); the Gallery may add them.
 */
export const INSPECTION_READERS: readonly Role[] = ["inspector"];
