import "server-only";
/**
 * Fills a LotReportData (lot-report-data.ts) from the database, for the web view and the PDF.
 * Decisions:
 * - A decided lot shows the counts its decision rested on (`decision_counts`), never a recount
 *   under a later rule, as the lot page does; an open lot shows its running verdict as provisional.
 * - A unit's defect classes and the Pareto's counts come from the measurement under its current
 *   grade (separate defects after merging overlaps); a unit not graded yet lists none.
 * - Photos: every current photo with a defect region of a unit that has a cosmetic defect, drawn
 *   from the stored preview at the report size, a few at a time (lot-report-photos.ts). `photos: false` leaves
 *   them out (the web view shows the unit list and links the PDF instead of decoding images).
 */
import { getLot } from "@/db/queries/lots";
import { listUnitsAwaitingRecheck } from "@/db/queries/rechecks";
import { listLotReportPhotos, listLotUnitDefects } from "@/db/queries/lot-report";
import { getPartType } from "@/db/queries/part-types";
import { userNames } from "@/db/queries/reports";
import { listLotUnits, listUnitResults } from "@/db/queries/units";
import { getWorkspace } from "@/db/queries/workspaces";
import type { ChecklistItem } from "@/lib/part-types/schemas";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { Role } from "@/lib/auth/roles";
import { notFound } from "@/lib/errors";
import { hidesUnitsAwaitingRecheck } from "@/lib/gallery/access";
import { DEFECT_SEVERITIES as SEVERITY_ORDER } from "@/lib/part-types/severity";
import { oneLotProgress, progressInput } from "@/lib/lots/progress";
import { decidedVerdictView } from "@/lib/lots/verdict";
import { getObjectBuffer, objectStore } from "@/lib/storage/s3";
import { annotateReportPhotos } from "./lot-report-photos";
import type { LotReportData, LotReportPhoto, LotReportPlanRow, LotReportUnit } from "./lot-report-data";

/** `roles`: readers without inspection.read see no grade or defect of a unit whose blind recheck still waits (issue 19). */
type Reader = { workspaceId: string; name: string; roles: readonly Role[] };

/** "Battery voltage 2.9 V", "Camera focus", "Housing colour: Slate". */
export function failureLabel(item: ChecklistItem | undefined, itemId: string, value: unknown): string {
  if (!item) return itemId;
  const v = value as { reading?: number; choice?: string } | null;
  if (item.kind === "numeric" && typeof v?.reading === "number") return `${item.label} ${v.reading.toFixed(item.decimals)} ${item.unit}`.trim();
  if (item.kind === "choice" && typeof v?.choice === "string") return `${item.label}: ${item.options.find((o) => o.value === v.choice)?.label ?? v.choice}`;
  return item.label;
}

export async function loadLotReport(reader: Reader, lotId: string, { photos = true }: { photos?: boolean } = {}): Promise<LotReportData> {
  const { workspaceId } = reader;
  const row = await getLot({ workspaceId, lotId });
  if (!row) throw notFound("That lot");
  const { lot } = row;
  const [partType, workspace, progress, allUnitRows, allUnitDefects] = await Promise.all([
    getPartType({ workspaceId, partTypeId: lot.partTypeId }),
    getWorkspace({ workspaceId }),
    oneLotProgress(workspaceId, progressInput(row)),
    listLotUnits({ workspaceId, lotId }),
    listLotUnitDefects({ workspaceId, lotId }),
  ]);
  // A blind reader gets such units' checklist readings, never their grade or marked defects.
  const awaiting = hidesUnitsAwaitingRecheck(reader.roles) ? await listUnitsAwaitingRecheck({ workspaceId, unitIds: allUnitRows.map((u) => u.id) }) : new Set<string>();
  const unitRows = allUnitRows.map((u) => (awaiting.has(u.id) ? { ...u, grade: null } : u));
  const unitDefects = allUnitDefects.filter((d) => !awaiting.has(d.unitId));
  const classes = partType?.defectClasses ?? [];
  const severityOf = new Map(classes.map((c) => [c.key, c.severity]));
  const labelOf = (key: string) => classes.find((c) => c.key === key)?.label ?? key;
  const rank = (key: string) => SEVERITY_ORDER.indexOf((severityOf.get(key) ?? "minor") as DefectSeverity);

  const decided = lot.status === "decided" && lot.verdict && lot.decisionCounts;
  const verdict = decided ? decidedVerdictView(lot.plan, { verdict: lot.verdict!, counts: lot.decisionCounts! }, progress.verdict) : progress.verdict;
  const plan = Object.fromEntries(
    SEVERITY_ORDER.map((severity) => {
      const p = lot.plan.byDefectSeverity[severity];
      const v = verdict.classes[severity];
      const planRow: LotReportPlanRow = {
        aql: p.aql,
        codeLetter: p.codeLetter,
        planLetter: p.planLetter,
        sampleSize: p.sampleSize,
        accept: p.accept,
        reject: p.reject,
        inspected: v.inspected,
        found: v.found,
      };
      return [severity, planRow];
    }),
  ) as Record<DefectSeverity, LotReportPlanRow>;

  const defectsByUnit = new Map<string, { defect: string; defects: number }[]>();
  for (const d of unitDefects) defectsByUnit.set(d.unitId, [...(defectsByUnit.get(d.unitId) ?? []), d]);
  const results = await listUnitResults({ workspaceId, unitIds: unitRows.map((u) => u.id) });
  const checklist = new Map((partType?.checklist ?? []).map((item) => [item.id, item]));
  const units: LotReportUnit[] = unitRows.map((u) => ({
    sampleIndex: u.sampleIndex,
    serial: u.serial,
    grade: u.grade,
    defectClasses: (defectsByUnit.get(u.id) ?? []).sort((a, b) => rank(a.defect) - rank(b.defect) || a.defect.localeCompare(b.defect)).map((d) => labelOf(d.defect)),
    functionalFailures: results.filter((r) => r.unitId === u.id && !r.passed).map((r) => failureLabel(checklist.get(r.itemId), r.itemId, r.value)),
  }));

  const counts = new Map<string, number>();
  for (const d of unitDefects) counts.set(d.defect, (counts.get(d.defect) ?? 0) + d.defects);
  const names = await userNames({ workspaceId, userIds: lot.decidedBy ? [lot.decidedBy] : [] });

  return {
    workspaceName: workspace?.name ?? "",
    generatedAt: new Date(),
    generatedBy: reader.name,
    lot: {
      purchaseRef: lot.purchaseRef,
      supplierName: row.supplierName,
      partTypeName: row.partTypeName,
      modelFamily: lot.modelFamily,
      quantity: lot.quantity,
      receivedOn: lot.receivedOn,
      inspectionLevel: lot.inspectionLevel,
      inspectionSeverity: lot.inspectionSeverity,
      hundredPercent: lot.plan.hundredPercent,
      sampleSize: lot.plan.sampleSize,
      switchingReason: lot.plan.switchingReason || undefined,
    },
    plan,
    decision:
      lot.status === "decided" && lot.verdict && lot.decidedAt
        ? { verdict: lot.verdict, disposition: lot.disposition, reason: lot.dispositionReason, decidedBy: (lot.decidedBy && names.get(lot.decidedBy)) || "", decidedAt: lot.decidedAt }
        : null,
    runningVerdict: lot.status === "decided" ? undefined : progress.verdict.verdict,
    units,
    defectCounts: [...counts].map(([key, count]) => ({ key, label: labelOf(key), count })),
    photos: photos ? await annotatedPhotos(workspaceId, lotId, unitRows, defectsByUnit, classes, partType?.views ?? []) : [],
  };
}

async function annotatedPhotos(
  workspaceId: string,
  lotId: string,
  unitRows: { id: string; serial: string | null; sampleIndex: number; grade: string | null }[],
  defectsByUnit: Map<string, unknown[]>,
  classes: { key: string; label: string }[],
  views: { key: string; label: string }[],
): Promise<LotReportPhoto[]> {
  const defective = unitRows.filter((u) => defectsByUnit.has(u.id));
  const rows = await listLotReportPhotos({ workspaceId, lotId, unitIds: defective.map((u) => u.id) });
  const store = objectStore();
  return annotateReportPhotos(rows, { read: (key) => getObjectBuffer(store, key), units: new Map(unitRows.map((u) => [u.id, u])), classes, views });
}
