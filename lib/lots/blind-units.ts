/**
 * A lot's units as a reader may see them: per-unit grades and findings are inspection work
 * (`inspection.read`), so for anyone without it (auditors, who recheck blind) they are left out.
 * The lot's counts and verdict stay: they are the lot's, not one unit's.
 */
import { can } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";

export function unitsForReader<T extends { grade: unknown }>(rows: T[], reader: { roles: readonly Role[] }): T[] {
  return can(reader, "inspection.read") ? rows : rows.map((row) => ({ ...row, grade: null }));
}
