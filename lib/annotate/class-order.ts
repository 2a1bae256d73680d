/**
 * The order the Bench offers a part type's defect classes in, and the class it starts with.
 * Grouped by severity, least severe first (minor, major, critical), the part type's own order
 * kept inside each group: number keys 1–9 follow this order, so key 1 — and the class a fresh
 * canvas starts with — is never a critical class unless every class is critical, and a critical
 * class is always a deliberate choice. With only critical classes there is no starting class:
 * the inspector picks one before drawing. Pure.
 */
import { DEFECT_SEVERITIES_MILDEST_FIRST, type DefectSeverity } from "@/lib/part-types/severity";

export function benchClassOrder<T extends { severity: DefectSeverity }>(classes: readonly T[]): T[] {
  return DEFECT_SEVERITIES_MILDEST_FIRST.flatMap((severity) => classes.filter((c) => c.severity === severity));
}

/** The class a fresh canvas draws with: the first non-critical one in bench order, else none. */
export function startingClass<T extends { key: string; severity: DefectSeverity }>(classes: readonly T[]): string | null {
  return benchClassOrder(classes).find((c) => c.severity !== "critical")?.key ?? null;
}
