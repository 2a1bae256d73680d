import "server-only";
/**
 * The Reports screen's figures for one filter: the database rows (db/queries/reports.ts) handed to
 * the pure report functions beside this file. Decisions:
 * - Defectives per 100 per severity come from the counts a lead's decision recorded
 *   (`lots.decision_counts`), the same counts the verdict and the switching rules used; an open
 *   lot adds no inspected units there yet (its running count may still change), but it does add
 *   its graded units to the per-class figures, which are counted from measurements.
 * - Bench minutes per unit follow bench-time.ts's rule over the claim history in the activity
 *   log; a lead handing a unit over (`unit.reassigned`) is a claim by the new holder.
 * - Throughput's range is the filter's days, or the first to last day with a grade when none given.
 */
import { countGradesByDay, listInspectionGrades, listScorecardLots, listUnitClaimEvents, type ScorecardLotRow } from "@/db/queries/reports";
import type { DefectSeverity } from "@/lib/part-types/severity";
import { DEFECT_SEVERITIES as SEVERITY_ORDER } from "@/lib/part-types/severity";
import { localDate } from "@/lib/time/periods";
import { benchTime, type BenchEvent } from "./bench-time";
import type { ReportFilter } from "./filters";
import { gradeDistribution, type GradeDistribution } from "./grade-distribution";
import { supplierScorecards, type SupplierLotRow, type SupplierScorecard } from "./supplier-scorecard";
import { inspectorThroughput, type ThroughputReport, type ThroughputRow } from "./throughput";

type Scope = { workspaceId: string; filter: ReportFilter; timeZone: string };

export function scorecardInput(row: ScorecardLotRow): SupplierLotRow {
  const bySeverity = Object.fromEntries(
    SEVERITY_ORDER.map((severity) => {
      const counts = row.status === "decided" ? row.decisionCounts?.[severity] : undefined;
      // A unit with a nonconformity counts as defective before all its checks are done
      // (lib/lots/verdict.ts), so a decision may record more defectives than fully inspected
      // units; such units were examined, so they count as inspected too (the larger of the two:
      // a lower bound of the units examined, which keeps the rate at most 100).
      const defectives = counts?.found ?? 0;
      return [severity, { inspected: Math.max(counts?.inspected ?? 0, defectives), defectives }];
    }),
  ) as Record<DefectSeverity, { inspected: number; defectives: number }>;
  return { supplierId: row.supplierId, receivedOn: row.receivedOn, status: row.status, verdict: row.verdict, bySeverity, inspected: row.inspected, classes: row.classes };
}

export async function loadSupplierScorecards(scope: Scope, classLabels: Readonly<Record<string, string>>): Promise<SupplierScorecard[]> {
  const rows = await listScorecardLots(scope);
  return supplierScorecards(rows.map(scorecardInput), classLabels);
}

export async function loadGradeDistribution(scope: Scope, period: "week" | "month"): Promise<GradeDistribution[]> {
  return gradeDistribution(await countGradesByDay(scope), period);
}

/** A claim-history entry as a bench event; null for an entry that says nothing about the bench. */
export function benchEventOf(entry: { action: string; actorId: string | null; detail: Record<string, unknown>; at: Date }): BenchEvent | null {
  switch (entry.action) {
    case "unit.claimed":
      return { at: entry.at, kind: "claimed", userId: entry.actorId };
    case "unit.reassigned":
      return typeof entry.detail.to === "string" ? { at: entry.at, kind: "claimed", userId: entry.detail.to } : null;
    case "unit.released":
      return { at: entry.at, kind: "released" };
    case "unit.lease_expired":
      return { at: entry.at, kind: "lease_expired" };
    default:
      return null;
  }
}

export async function loadThroughput(scope: Scope): Promise<ThroughputReport> {
  const graded = await listInspectionGrades(scope);
  const events = await listUnitClaimEvents({ workspaceId: scope.workspaceId, unitIds: graded.map((g) => g.unitId) });
  const eventsByUnit = new Map<string, BenchEvent[]>();
  for (const entry of events) {
    const event = benchEventOf(entry);
    if (!event) continue;
    const list = eventsByUnit.get(entry.unitId) ?? [];
    list.push(event);
    eventsByUnit.set(entry.unitId, list);
  }
  const rows: ThroughputRow[] = graded.map((g) => {
    const time = benchTime([...(eventsByUnit.get(g.unitId) ?? []), { at: g.gradedAt, kind: "graded", userId: g.gradedBy }]);
    return { graderId: g.gradedBy, partTypeId: g.partTypeId, gradedAt: g.gradedAt, minutes: time.minutes, graderMinutes: time.minutes === null ? null : (time.byPerson[g.gradedBy] ?? null) };
  });
  const days = rows.map((r) => localDate(r.gradedAt, scope.timeZone)).sort();
  const from = scope.filter.from ?? days[0] ?? "2000-01-01";
  const to = scope.filter.to ?? days[days.length - 1] ?? from;
  return inspectorThroughput(rows, { from, to, timeZone: scope.timeZone });
}
