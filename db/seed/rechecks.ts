/**
 * The demo's rechecks (issue 19), so the Recheck screens say something on a newcomer's first visit
 * and there is work to try:
 * - History (the scorecards' weeks): inspection grades on the units of the three lots decided in
 *   the last three weeks (PO-24-0702, PO-24-0733, TR-5480), by the two inspectors in turn, and 13
 *   of them rechecked blind by the auditor: Ines Kaltenbrunn's 8 all agree; Piet Moravec's 5 agree
 *   on 3, so his agreement (60 %) is under the 80 % drift threshold — the drifting grader. His two
 *   disagreements were settled by the lead: one "first grade stands", one "recheck stands" (that
 *   lot was already decided, so the lead is told on its page and in the activity log, as the app
 *   does). These rows are written directly and say so: the history kept no photos or
 *   measurements (as db/seed/lots.ts says of its lots), and each recheck was sent by the lead by
 *   hand (no draw is claimed that could not be run again).
 * - Live, through the app's own steps on photographed units of the open lots (their planted marks
 *   saved as the inspector's regions, measured, graded; sent to recheck by the lead):
 *   a recheck of Ines's grade of a rear camera waiting in the auditor's queue, and a disagreement
 *   waiting for adjudication — Piet's grade of a battery, rechecked blind by the auditor, who
 *   marked everything but the swelling.
 * Invented data, demo only.
 */
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db, transaction } from "@/db/client";
import { getLatestPublished } from "@/db/queries/rubrics";
import { activityLog, grades, lots, partTypes, rechecks, units, users, workspaces } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import type { Role } from "@/lib/auth/roles";
import { gradeAgreement, gradeSteps } from "@/lib/grading/grade-steps";
import { recordGrade } from "@/lib/grading/grades";
import type { Grade } from "@/lib/grading/rubric-schema";
import { measureAndStore } from "@/lib/grading/unit-grading";
import { adjudicationReasonsText, type AdjudicationReason } from "@/lib/recheck/adjudication";
import { takeNextRecheck } from "@/lib/recheck/queue";
import { sendToRecheck } from "@/lib/recheck/recording";
import { saveRecheckRegions } from "@/lib/recheck/recheck-regions";
import { measureRecheck, submitRecheck } from "@/lib/recheck/submit";
import { readRegionSet, saveRegionSet } from "@/lib/regions/regions";
import { classKeyOf, surfacePolygon } from "./photo-defects";
import type { PlantedPhoto } from "./photos";

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const HISTORY_LOTS = ["PO-24-0702", "PO-24-0733", "TR-5480"];
const HISTORY_NOTE = "Demo history: graded before photos and measurements were kept (invented by the seed).";

export async function person(workspaceId: string, email: string): Promise<SessionUser> {
  const [row] = await db()
    .select({ id: users.id, email: users.email, name: users.name, roles: users.roles, workspaceName: workspaces.name, timeZone: workspaces.timeZone })
    .from(users)
    .innerJoin(workspaces, eq(workspaces.id, users.workspaceId))
    .where(and(eq(users.workspaceId, workspaceId), eq(users.email, email)));
  if (!row) throw new Error(`Seed rechecks: no demo account ${email}`);
  return { ...row, workspaceId, roles: row.roles as Role[] };
}

/** First grade → recheck grade of each history recheck, per grader (HAND: Ines 8 of 8 agree, Piet 3 of 5). */
const INES: [Grade, Grade][] = [
  ["A", "A"],
  ["A", "A"],
  ["B", "B"],
  ["A", "A"],
  ["C", "C"],
  ["A", "A"],
  ["B", "B"],
  ["A", "A"],
];
const PIET: [Grade, Grade][] = [
  ["A", "A"],
  ["A", "B"],
  ["B", "B"],
  ["A", "A"],
  ["B", "C"],
];

async function seedHistory(workspaceId: string, people: { ines: SessionUser; piet: SessionUser; auditor: SessionUser; lead: SessionUser }) {
  const rows = await db()
    .select({ unitId: units.id, serial: units.serial, sampleIndex: units.sampleIndex, lotId: lots.id, lotCreatedAt: lots.createdAt, partTypeId: units.partTypeId })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .where(and(eq(units.workspaceId, workspaceId), inArray(lots.purchaseRef, HISTORY_LOTS)))
    .orderBy(asc(lots.createdAt), asc(units.sampleIndex));
  const queue = { ines: [...INES], piet: [...PIET] };
  let settled = 0;
  await transaction(async (tx) => {
    for (const [index, unit] of rows.entries()) {
      const who = index % 2 === 0 ? "ines" : "piet";
      const grader = people[who];
      const rubric = await getLatestPublished({ workspaceId, partTypeId: unit.partTypeId }, tx);
      if (!rubric) throw new Error(`Seed rechecks: no published rubric for the part type of ${unit.serial}`);
      // Every third of a grader's units is rechecked while the list lasts; the rest are graded as the rechecks' first grade would be, or A.
      const rechecked = Math.floor(index / 2) % 3 === 0 ? queue[who].shift() : undefined;
      const first: Grade = rechecked?.[0] ?? (index % 7 === 3 ? "B" : "A");
      // Graded within the lot's two days of inspection (the lots were decided two days after they came in).
      const gradedAt = new Date(unit.lotCreatedAt.getTime() + HOUR + unit.sampleIndex * 20 * 60_000);
      const [grade] = await tx
        .insert(grades)
        .values({
          workspaceId,
          unitId: unit.unitId,
          kind: "inspection",
          proposedGrade: first,
          finalGrade: first,
          rubricVersionId: rubric.id,
          measurementIds: [],
          explanation: { lines: [], notes: [HISTORY_NOTE] },
          regionsVersions: {},
          gradedBy: grader.id,
          createdAt: gradedAt,
        })
        .returning({ id: grades.id });
      if (!rechecked) continue;
      const [firstGrade, recheckGrade] = rechecked;
      const steps = gradeSteps(firstGrade, recheckGrade);
      const submittedAt = new Date(gradedAt.getTime() + 5 * HOUR);
      const base = {
        workspaceId,
        unitId: unit.unitId,
        gradeId: grade.id,
        firstGraderId: grader.id,
        firstGrade,
        firstGradedAt: gradedAt,
        partTypeId: unit.partTypeId,
        rubricVersionId: rubric.id,
        reason: "by_hand" as const,
        sentBy: people.lead.id,
        sentNote: HISTORY_NOTE,
        auditorId: people.auditor.id,
        proposedGrade: recheckGrade,
        recheckGrade,
        submittedAt,
        createdAt: new Date(gradedAt.getTime() + HOUR),
        comparison: { photos: [], classes: {}, grade: { first: firstGrade, recheck: recheckGrade, steps, agreement: gradeAgreement(firstGrade, recheckGrade) } },
        adjudicationReasons: steps === 0 ? [] : [{ kind: "grade_differs" as const, first: firstGrade, recheck: recheckGrade, steps }],
      };
      if (steps === 0) {
        await tx.insert(rechecks).values({ ...base, status: "agreed" });
        continue;
      }
      // Piet's two disagreements, settled by the lead a day later: the first time the first grade stands, the second the recheck's.
      const choice = settled++ === 0 ? ("first" as const) : ("recheck" as const);
      const final = choice === "first" ? firstGrade : recheckGrade;
      const reason =
        choice === "first" ? "The mark the auditor graded on is a reflection of the light box, not wear." : "The scuff on the frame is deeper than first judged; the auditor's grade stands.";
      const adjudicatedAt = new Date(submittedAt.getTime() + DAY);
      const [adjudication] = await tx
        .insert(grades)
        .values({
          workspaceId,
          unitId: unit.unitId,
          kind: "adjudication",
          proposedGrade: final,
          finalGrade: final,
          overrideReason: reason,
          rubricVersionId: rubric.id,
          measurementIds: [],
          explanation: { lines: [], notes: [HISTORY_NOTE] },
          regionsVersions: {},
          gradedBy: people.lead.id,
          createdAt: adjudicatedAt,
        })
        .returning({ id: grades.id });
      // The lot was decided on the first grades; a different outcome is told, never rewritten.
      const decidedLotAffected = final !== firstGrade;
      await tx.insert(rechecks).values({
        ...base,
        status: "settled",
        adjudicatedBy: people.lead.id,
        adjudicationChoice: choice,
        adjudicationReason: reason,
        adjudicationGradeId: adjudication.id,
        adjudicatedGrade: final,
        adjudicatedAt,
        decidedLotAffected,
      });
      if (decidedLotAffected) {
        await tx.insert(activityLog).values({
          workspaceId,
          actorId: people.lead.id,
          action: "lot.decided_lot_affected",
          subjectType: "lot",
          subjectId: unit.lotId,
          detail: { demo: true, unitId: unit.unitId, serial: unit.serial, from: firstGrade, to: final },
          createdAt: adjudicatedAt,
        });
      }
    }
    if (queue.ines.length + queue.piet.length > 0) throw new Error("Seed rechecks: the history lots have too few units for the planned rechecks.");
  });
  return { graded: rows.length, rechecked: INES.length + PIET.length, adjudicated: settled };
}

/** The planted marks of the unit's photos saved as `inspector`'s regions (with the part's outline as Surface), measured and graded as proposed. */
export async function gradeAsPlanted(inspector: SessionUser, unitId: string, planted: PlantedPhoto[], defectClasses: Set<string>) {
  for (const photo of planted.filter((p) => p.unitId === unitId)) {
    const current = await readRegionSet(inspector, photo.photoId);
    await saveRegionSet(inspector, photo.photoId, { baseVersion: current.version, regions: regionPayload(photo, defectClasses) });
  }
  await measureAndStore(inspector, unitId);
  return (await recordGrade(inspector, unitId, { decision: "accept" })).grade;
}

function regionPayload(photo: PlantedPhoto, defectClasses: Set<string>, leaveOut?: string) {
  const surface = surfacePolygon(photo.surface);
  const regions = photo.regions
    .map((r, i) => ({ id: `seed-${photo.viewKey}-${i + 1}`, defect: classKeyOf(r.defect), shape: r.shape }))
    .filter((r) => defectClasses.has(r.defect) && r.defect !== leaveOut);
  return { regions, surfaces: [{ id: "surface", shape: surface }], ruler: null };
}

/** The first photographed unit (the one with planted marks) of the open lot `purchaseRef`. */
async function flawedUnit(workspaceId: string, purchaseRef: string, planted: PlantedPhoto[]) {
  const rows = await db()
    .select({ unitId: units.id, serial: units.serial, defectClasses: partTypes.defectClasses })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(eq(units.workspaceId, workspaceId), eq(lots.purchaseRef, purchaseRef), eq(lots.status, "open")))
    .orderBy(asc(units.sampleIndex));
  const unit = rows.find((row) => planted.some((p) => p.unitId === row.unitId && p.regions.length > 0));
  if (!unit) throw new Error(`Seed rechecks: lot ${purchaseRef} has no photographed unit with planted marks.`);
  return { ...unit, classes: new Set(unit.defectClasses.map((d) => d.key)) };
}

/** The grade's recheck: the one the draw made when the grade was recorded, else one the lead sends by hand. */
async function recheckOf(lead: SessionUser, unitId: string, gradeId: string, note: string) {
  const [drawn] = await db().select({ id: rechecks.id }).from(rechecks).where(eq(rechecks.gradeId, gradeId));
  return drawn ?? (await sendToRecheck(lead, { unitId, note }));
}

/** What the battery's disagreement is about, for the log: the grades when they differ, and what else does. */
function disagreementText(first: Grade, recheck: Grade, reasons: readonly AdjudicationReason[]): string {
  const grades = first === recheck ? `both graded ${first}` : null;
  return [grades, adjudicationReasonsText(reasons)].filter(Boolean).join("; ");
}

export async function seedRechecks(workspaceSlug: string, planted: PlantedPhoto[]) {
  const [ws] = await db().select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.slug, workspaceSlug));
  const workspaceId = ws.id;
  const people = {
    ines: await person(workspaceId, "inspector@vellmoor.example"),
    piet: await person(workspaceId, "inspector2@vellmoor.example"),
    auditor: await person(workspaceId, "auditor@vellmoor.example"),
    lead: await person(workspaceId, "lead@vellmoor.example"),
  };
  const history = await seedHistory(workspaceId, people);

  // The disagreement: Piet grades the battery as planted; the auditor, blind, marks all but the swelling.
  const battery = await flawedUnit(workspaceId, "TR-5521", planted);
  const pietGrade = await gradeAsPlanted(people.piet, battery.unitId, planted, battery.classes);
  const disagreement = await recheckOf(people.lead, battery.unitId, pietGrade.id, "Swollen cells are easy to miss in this light; a second look, please.");
  const taken = await takeNextRecheck(people.auditor);
  if (taken?.id !== disagreement.id) throw new Error("Seed rechecks: the auditor's next recheck is not the battery's.");
  for (const photo of planted.filter((p) => p.unitId === battery.unitId)) {
    await saveRecheckRegions(people.auditor, disagreement.id, photo.photoId, { baseVersion: 0, regions: regionPayload(photo, battery.classes, "swelling") });
  }
  const measured = await measureRecheck(people.auditor, disagreement.id);
  const submitted = await submitRecheck(people.auditor, disagreement.id, { decision: "accept", proposedGrade: measured.proposal.grade as Grade });
  if (submitted.status !== "adjudication") throw new Error(`Seed rechecks: the battery's recheck was expected to need adjudication, it is ${submitted.status}.`);

  // The recheck waiting for the auditor: Ines's grade of the rear camera.
  const camera = await flawedUnit(workspaceId, "PO-24-0769", planted);
  const inesGrade = await gradeAsPlanted(people.ines, camera.unitId, planted, camera.classes);
  const waiting = await recheckOf(people.lead, camera.unitId, inesGrade.id, "Dust on the lens window: worth a second look before the lot is decided.");
  const [{ n }] = await db()
    .select({ n: sql<number>`count(*)::int` })
    .from(rechecks)
    .where(eq(rechecks.workspaceId, workspaceId));
  console.log(
    `Demo rechecks: ${history.graded} history grades, ${history.rechecked} rechecked (${history.adjudicated} adjudicated; Piet Moravec drifting), ` +
      `a disagreement on ${battery.serial} waiting for adjudication (${disagreementText(pietGrade.finalGrade as Grade, submitted.recheckGrade, submitted.reasons)}) and a recheck of ${camera.serial} waiting (${n} in all).`,
  );
  return { ...history, disagreement: disagreement.id, waiting: waiting.id };
}
