/**
 * The demo's graded photographed units for issue 17's screens.
 *
 * The condition certificate (issue 17), so a newcomer finds one and its verification page
 * on a first visit: a clean photographed unit of an open Vellmoor lot (a unit whose photos carry
 * no planted marks, with a serial and, where the seed recorded one, a complete checklist) is
 * graded by an inspector through the app's own steps (its Surface saved as regions, measured,
 * graded as proposed; rechecks.ts's gradeAsPlanted) and the lead issues its certificate through
 * lib/certificates (the function POST /api/units/:id/certificates calls). Nothing is written
 * directly.
 *
 * Every supplier's Pareto: a supplier's scorecard counts defect classes from measured photos of
 * graded units, and the recheck seed grades photographed units of Orvane and Tamsin Ridge only.
 * The flawed photographed unit of each other supplier's open lot (Lumabay's display) is graded as
 * planted by the same steps, so each scorecard's Pareto has bars on a first visit.
 * Invented data, demo only.
 */
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { checklistResults, lots, partTypes, rechecks, units, workspaces } from "@/db/schema";
import { issueCertificate } from "@/lib/certificates/certificates";
import type { PlantedPhoto } from "./photos";
import { gradeAsPlanted, person } from "./rechecks";

export async function seedCertificate(workspaceSlug: string, planted: PlantedPhoto[]) {
  const [ws] = await db().select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.slug, workspaceSlug));
  const workspaceId = ws.id;
  const inspector = await person(workspaceId, "inspector@vellmoor.example");
  const lead = await person(workspaceId, "lead@vellmoor.example");

  const photographed = [...new Set(planted.map((p) => p.unitId))];
  const clean = photographed.filter((unitId) => planted.filter((p) => p.unitId === unitId).every((p) => p.regions.length === 0));
  if (clean.length === 0) throw new Error("Seed certificate: no clean photographed unit.");
  const rows = await db()
    .select({
      unitId: units.id,
      serial: units.serial,
      graded: sql<boolean>`EXISTS (SELECT 1 FROM grades g WHERE g.workspace_id = ${units.workspaceId} AND g.unit_id = ${units.id})`,
      purchaseRef: lots.purchaseRef,
      defectClasses: partTypes.defectClasses,
      checklistItems: sql<number>`jsonb_array_length(${partTypes.checklist})`,
      recorded: sql<number>`(SELECT count(*)::int FROM ${checklistResults} c WHERE c.workspace_id = ${units.workspaceId} AND c.unit_id = ${units.id})`,
    })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(eq(units.workspaceId, workspaceId), inArray(units.id, clean), eq(lots.status, "open")))
    .orderBy(asc(lots.purchaseRef), asc(units.sampleIndex));
  // Ungraded, with a serial; a complete checklist first, so the certificate's summary says pass rather than "not recorded".
  const candidates = rows.filter((r) => r.serial && !r.graded).sort((a, b) => Number(b.recorded >= b.checklistItems) - Number(a.recorded >= a.checklistItems));
  const unit = candidates[0];
  if (!unit) throw new Error("Seed certificate: no clean photographed unit with a serial and no grade.");

  const grade = await gradeAsPlanted(inspector, unit.unitId, planted, new Set(unit.defectClasses.map((d) => d.key)));
  const certificate = await issueCertificate(lead, unit.unitId);
  const [drawn] = await db().select({ id: rechecks.id }).from(rechecks).where(eq(rechecks.gradeId, grade.id));
  console.log(
    `Demo certificate: ${unit.serial} of ${unit.purchaseRef} graded ${grade.finalGrade} by ${inspector.name}` +
      `${unit.recorded >= unit.checklistItems ? "" : " (checklist not complete)"}${drawn ? " (drawn for recheck)" : ""}; certificate ${certificate.shortCode} issued by ${lead.name}.`,
  );
  return { unitId: unit.unitId, serial: unit.serial, grade: grade.finalGrade, certificateId: certificate.id, shortCode: certificate.shortCode };
}

/** Grades, as planted, the first flawed photographed unit of every supplier whose scorecard has no measured defect yet. */
export async function seedSupplierParetos(workspaceSlug: string, planted: PlantedPhoto[]) {
  const [ws] = await db().select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.slug, workspaceSlug));
  const workspaceId = ws.id;
  const inspector = await person(workspaceId, "inspector@vellmoor.example");
  const flawed = [...new Set(planted.filter((p) => p.regions.length > 0).map((p) => p.unitId))];
  if (flawed.length === 0) return [];
  const rows = await db()
    .select({ unitId: units.id, supplierId: lots.supplierId, purchaseRef: lots.purchaseRef, defectClasses: partTypes.defectClasses })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(eq(units.workspaceId, workspaceId), inArray(units.id, flawed), eq(lots.status, "open")))
    .orderBy(asc(lots.purchaseRef), asc(units.sampleIndex));
  const measured = await db().execute<{ supplier_id: string }>(sql`
    SELECT DISTINCT l.supplier_id FROM grades g JOIN units u ON u.id = g.unit_id JOIN lots l ON l.id = u.lot_id
    JOIN measurements m ON m.id = ANY(g.measurement_ids) AND m.photo_id IS NOT NULL
    WHERE g.workspace_id = ${workspaceId} AND m.result->'measurement'->'byDefect' <> '{}'::jsonb`);
  const done = new Set(measured.rows.map((r) => r.supplier_id));
  const graded: string[] = [];
  for (const row of rows) {
    if (done.has(row.supplierId)) continue;
    const grade = await gradeAsPlanted(inspector, row.unitId, planted, new Set(row.defectClasses.map((d) => d.key)));
    done.add(row.supplierId);
    graded.push(`${row.purchaseRef} (grade ${grade.finalGrade})`);
  }
  if (graded.length) console.log(`Demo scorecards: graded the flawed photographed unit of ${graded.join(", ")} as planted, so every supplier's Pareto has bars.`);
  return graded;
}
