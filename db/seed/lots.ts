/**
 * The demo's lots, built with the same pure functions the app uses (switching rules, ISO 2859-1
 * plans, the seeded draw, checklist evaluation, the verdict), so what the screens show is what
 * the app itself would have computed. Fails loudly if a lot does not reach its expected verdict.
 */
import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import type { Database } from "@/db/client";
import { activityLog, checklistResults, lots, units, type LotDecisionCounts, type PartType } from "@/db/schema";
import { evaluateChecklistItem } from "@/lib/checklist/evaluate";
import { unitFindings } from "@/lib/lots/findings";
import { buildLotPlan, DEFAULT_AQLS } from "@/lib/lots/plan";
import { DEFECT_SEVERITIES } from "@/lib/part-types/severity";
import { switchingInputFor, type DecidedLotRow } from "@/lib/lots/switching-history";
import { lotVerdict } from "@/lib/lots/verdict";
import { nextInspectionState } from "@/lib/sampling/switching";
import { closeLotUnits } from "@/lib/units/lot-closing";
import { DRAW_ALGORITHM, drawSample } from "@/lib/units/sample-draw";
import { LOT_SCENARIO } from "./lot-scenario";
import type { seedPeople } from "./people";
import type { ChecklistItem } from "@/lib/part-types/schemas";
import type { ChecklistValue } from "@/lib/units/schemas";

type People = Awaited<ReturnType<typeof seedPeople>>;
const DAY = 86_400_000;
const isoDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** A value that passes the item (mid-range readings, the first passing choice). */
function passingValue(item: ChecklistItem): ChecklistValue {
  if (item.kind === "pass_fail") return { pass: true };
  if (item.kind === "choice") return { choice: item.options.find((o) => o.passes)!.value };
  const low = item.min ?? 0;
  const high = item.max ?? low + 10;
  return { reading: Number(((low + high) / 2).toFixed(item.decimals)) };
}

/** Runs after seedPartTypes (it reads the seeded part types of the Vellmoor workspace). */
export async function seedLots(database: Database, people: People) {
  const ws = people.vellmoor;
  const lead = ws.userIds["lead@vellmoor.example"];
  const inspectors = [ws.userIds["inspector@vellmoor.example"], ws.userIds["inspector2@vellmoor.example"]];
  const today = Date.UTC(new Date().getUTCFullYear(), new Date().getUTCMonth(), new Date().getUTCDate());
  const history = new Map<string, DecidedLotRow[]>();
  const created: { purchaseRef: string; id: string; verdict: string }[] = [];

  await database.transaction(async (tx) => {
    const partTypeRows = await tx.query.partTypes.findMany({ where: (p, { eq }) => eq(p.workspaceId, ws.workspaceId) });
    const bySlug = new Map<string, PartType>(partTypeRows.map((p) => [p.slug, p]));
    for (const [index, spec] of LOT_SCENARIO.entries()) {
      const partType = bySlug.get(spec.partType)!;
      const supplierId = ws.supplierIds[spec.supplier];
      const key = `${supplierId}/${partType.id}`;
      const state = nextInspectionState(switchingInputFor(history.get(key) ?? [], null));
      const plan = buildLotPlan({
        lotSize: spec.quantity,
        level: "II",
        aqls: DEFAULT_AQLS,
        severity: state.severity,
        inspectAll: partType.inspectAll,
        switchingReason: state.reason,
        switchingProgress: state.progress,
      });
      const receivedMs = today - spec.receivedDaysAgo * DAY;
      const createdAt = new Date(receivedMs + 9 * 3_600_000);
      const seed = String(20_240_000 + index * 7919);
      const pool = Array.from({ length: spec.quantity }, (_, i) => `${spec.serialPrefix}-${String((index + 1) * 1000 + i + 1).padStart(6, "0")}`);
      const serials = spec.units === "serials" ? drawSample(pool, plan.sampleSize, seed) : spec.units === "placeholders" ? Array<null>(plan.sampleSize).fill(null) : [];
      const [lot] = await tx
        .insert(lots)
        .values({
          workspaceId: ws.workspaceId,
          supplierId,
          partTypeId: partType.id,
          purchaseRef: spec.purchaseRef,
          modelFamily: partType.modelFamily,
          quantity: spec.quantity,
          receivedOn: isoDate(receivedMs),
          dueOn: isoDate(receivedMs + spec.dueInDays * DAY),
          inspectionLevel: "II",
          aqlCritical: DEFAULT_AQLS.critical,
          aqlMajor: DEFAULT_AQLS.major,
          aqlMinor: DEFAULT_AQLS.minor,
          inspectionSeverity: state.severity,
          plan,
          sampleSeed: spec.units === "serials" ? seed : null,
          sampleDraw:
            spec.units === "none"
              ? null
              : spec.units === "serials"
                ? {
                    source: "serials",
                    poolSize: pool.length,
                    poolSha256: crypto.createHash("sha256").update(pool.join("\n")).digest("hex"),
                    seed,
                    algorithm: DRAW_ALGORITHM,
                    drawnAt: createdAt.toISOString(),
                    drawnBy: lead,
                  }
                : { source: "placeholders", drawnAt: createdAt.toISOString(), drawnBy: lead },
          createdBy: lead,
          createdAt,
          updatedAt: createdAt,
        })
        .returning();
      const recordCount = spec.recorded === "all" ? serials.length : Math.min(spec.recorded, serials.length);
      const unitRows = serials.map((serial, i) => {
        const worked = i < recordCount;
        const recordedAt = new Date(createdAt.getTime() + (i + 1) * 600_000);
        return {
          workspaceId: ws.workspaceId,
          lotId: lot.id,
          sampleIndex: i + 1,
          serial,
          placeholder: serial === null,
          partTypeId: partType.id,
          supplierId,
          lotDueOn: lot.dueOn,
          lotReceivedOn: lot.receivedOn,
          lotCreatedAt: createdAt,
          // Recording a checklist takes a unit onto the bench; those leases ran out long ago.
          status: worked ? ("on_bench" as const) : ("queued" as const),
          leaseHolderId: worked ? inspectors[i % 2] : null,
          leaseExpiresAt: worked ? new Date(recordedAt.getTime() + 1_200_000) : null,
          claimedAt: worked ? recordedAt : null,
        };
      });
      const insertedUnits = unitRows.length ? await tx.insert(units).values(unitRows).returning({ id: units.id, sampleIndex: units.sampleIndex, status: units.status }) : [];
      const results = insertedUnits
        .filter((u) => u.sampleIndex <= recordCount)
        .flatMap((u) =>
          partType.checklist.map((item) => {
            const failing = spec.failures?.[u.sampleIndex]?.find((f) => f.itemId === item.id);
            const evaluation = evaluateChecklistItem(item, failing?.value ?? passingValue(item));
            return {
              workspaceId: ws.workspaceId,
              unitId: u.id,
              itemId: item.id,
              value: evaluation.value,
              passed: evaluation.passed,
              failureReason: evaluation.failureReason,
              severityOnFail: item.severityOnFail,
              recordedBy: inspectors[(u.sampleIndex - 1) % 2],
              recordedAt: new Date(createdAt.getTime() + u.sampleIndex * 600_000),
            };
          }),
        );
      for (let start = 0; start < results.length; start += 1000) await tx.insert(checklistResults).values(results.slice(start, start + 1000));
      // The demo's history has no photos or grades: its lots are judged on their checklists alone, as
      // lots were before cosmetic grades counted; the app judges the open ones live.
      const verdict = lotVerdict(plan, unitFindings({ units: insertedUnits, results, checklistItemIds: partType.checklist.map((i) => i.id), cosmeticGrading: false }));
      await tx.insert(activityLog).values({
        workspaceId: ws.workspaceId,
        actorId: lead,
        action: "lot.created",
        subjectType: "lot",
        subjectId: lot.id,
        detail: { demo: true, severity: state.severity, sampleSize: plan.sampleSize, switchingReason: state.reason },
        createdAt,
      });
      if (spec.decision) {
        if (verdict.verdict !== spec.decision.expect) throw new Error(`Seed lot ${spec.purchaseRef}: expected ${spec.decision.expect}, the verdict is ${verdict.verdict} (${verdict.summary})`);
        const decisionCounts = Object.fromEntries(
          DEFECT_SEVERITIES.map((s) => [s, { found: verdict.classes[s].found, inspected: verdict.classes[s].inspected, sampleSize: verdict.classes[s].sampleSize }]),
        ) as LotDecisionCounts;
        const decidedAt = new Date(createdAt.getTime() + 2 * DAY);
        await tx
          .update(lots)
          .set({ status: "decided", verdict: verdict.verdict, disposition: spec.decision.disposition, dispositionReason: spec.decision.reason, decisionCounts, decidedBy: lead, decidedAt })
          .where(eq(lots.id, lot.id));
        await closeLotUnits(tx, { workspaceId: ws.workspaceId, lotId: lot.id, at: decidedAt });
        await tx.insert(activityLog).values({
          workspaceId: ws.workspaceId,
          actorId: lead,
          action: "lot.decided",
          subjectType: "lot",
          subjectId: lot.id,
          detail: { demo: true, verdict: verdict.verdict, disposition: spec.decision.disposition },
          createdAt: decidedAt,
        });
        history.set(key, [...(history.get(key) ?? []), { id: lot.id, purchaseRef: lot.purchaseRef, inspectionSeverity: state.severity, verdict: verdict.verdict, plan, decisionCounts }]);
      }
      created.push({ purchaseRef: spec.purchaseRef, id: lot.id, verdict: spec.decision ? verdict.verdict : `open (${verdict.verdict})` });
    }
  });
  return created;
}
