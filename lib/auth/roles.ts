/**
 * The four roles; a user may hold several. What each may do is named in lib/auth/permissions.ts
 * (leads hold every permission); access checks ask `can(user, permission)`, never for a role.
 */
export const ROLES = ["inspector", "trainer", "auditor", "lead"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  inspector: "Inspector",
  trainer: "Trainer",
  auditor: "Auditor",
  lead: "QC lead",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
