import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { InspectionSeverityBadge, VerdictBadge } from "@/components/lots/badges";
import { EvidencePanel } from "@/components/evidence/evidence-panel";
import { DispositionForm } from "@/components/lots/disposition-form";
import { LotUnitsList } from "@/components/lots/lot-units-list";
import { CountingNote, PlanTable } from "@/components/lots/plan-table";
import { SwitchingBox } from "@/components/lots/switching-box";
import { UnitImport } from "@/components/lots/unit-import";
import { BatteryCaution, StaticCaution } from "@/components/ui/cautions";
import { getLot } from "@/db/queries/lots";
import { listDecidedLotAffected } from "@/db/queries/rechecks";
import { listLotUnits } from "@/db/queries/units";
import { unitsForReader } from "@/lib/lots/blind-units";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { oneLotProgress, progressInput } from "@/lib/lots/progress";
import { switchingStateFor } from "@/lib/lots/scheme";
import { decidedVerdictView } from "@/lib/lots/verdict";
import { DISPOSITION_LABELS } from "@/lib/lots/schemas";
import { STATIC_SENSITIVE, type PartCategory } from "@/lib/part-types/schemas";
import { formatDate } from "@/lib/time/format";

export const metadata: Metadata = { title: "Lot" };

export default async function LotPage(props: PageProps<"/lots/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "lots.read", from: `/lots/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const row = await getLot({ workspaceId: user.workspaceId, lotId: id });
  if (!row) notFound();
  const { lot } = row;
  const [progress, lotUnits, next, affected] = await Promise.all([
    oneLotProgress(user.workspaceId, progressInput(row)),
    listLotUnits({ workspaceId: user.workspaceId, lotId: id }).then((rows) => unitsForReader(rows, user)),
    switchingStateFor({ workspaceId: user.workspaceId, supplierId: lot.supplierId, partTypeId: lot.partTypeId }),
    lot.status === "decided" ? listDecidedLotAffected({ workspaceId: user.workspaceId, lotId: id }) : Promise.resolve([]),
  ]);
  // A decided lot shows the counts its decision rested on, never a recount under a later rule.
  const verdict =
    lot.status === "decided" && lot.verdict && lot.decisionCounts ? decidedVerdictView(lot.plan, { verdict: lot.verdict, counts: lot.decisionCounts }, progress.verdict) : progress.verdict;
  const canDecide = can(user, "lots.decide");
  const canManage = can(user, "lots.manage");
  const shownVerdict = lot.status === "decided" && lot.verdict ? lot.verdict : verdict.verdict;
  const percent = Math.round((100 * verdict.unitsInspected) / Math.max(1, lot.plan.sampleSize));

  return (
    <div className="max-w-6xl space-y-6">
      <Link href="/lots" className="text-sm text-gauge-600 underline">
        ← Lots
      </Link>
      {affected.length > 0 && (
        <div role="alert" className="rounded-md border-2 border-signal-500 bg-signal-50 p-3 text-sm text-signal-800" data-testid="decided-lot-affected">
          This lot was decided before {affected.length === 1 ? "an adjudication" : `${affected.length} adjudications`} changed a unit&apos;s grade (
          {affected.map((a) => a.serial ?? "a unit").join(", ")}). The decision and its counts stay as recorded; review whether the lot needs a follow-up.
        </div>
      )}
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="page-title">Lot {lot.purchaseRef}</h1>
          <p className="text-gauge-700">
            {row.supplierName} · {row.partTypeName}
            {lot.modelFamily ? ` (${lot.modelFamily})` : ""} · {lot.quantity.toLocaleString("en-GB")} units · received {lot.receivedOn} · due {lot.dueOn} ·{" "}
            <span data-testid="promised-grade">bought at grade {lot.promisedGrade}</span>
          </p>
        </div>
        <div className="flex items-center gap-2">
          <InspectionSeverityBadge severity={lot.inspectionSeverity} />
          <VerdictBadge verdict={shownVerdict} testId="lot-verdict" />
          <span className="text-sm text-gauge-600">{lot.status === "decided" ? "decided" : "open"}</span>
        </div>
      </div>
      {row.partTypeCategory === "battery" && <BatteryCaution />}
      {STATIC_SENSITIVE.includes(row.partTypeCategory as PartCategory) && <StaticCaution />}

      <section className="card space-y-3 p-5" aria-labelledby="progress-title">
        <h2 id="progress-title" className="text-lg font-semibold">
          Progress: {verdict.unitsInspected} of {lot.plan.sampleSize} units inspected
        </h2>
        <div
          className="h-2 overflow-hidden rounded bg-gauge-100"
          role="progressbar"
          aria-valuemin={0}
          aria-valuemax={lot.plan.sampleSize}
          aria-valuenow={verdict.unitsInspected}
          aria-label="Units inspected"
        >
          <div className="h-full bg-gauge-600" style={{ width: `${percent}%` }} />
        </div>
        <p className="text-sm" data-testid="verdict-summary">
          {lot.status === "decided" ? verdict.summary : `Running verdict. ${verdict.summary}`}
        </p>
      </section>

      <section className="card space-y-3 p-5" aria-labelledby="plan-title">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="plan-title" className="text-lg font-semibold">
            Sampling plan
          </h2>
          <span className="text-xs text-gauge-600">
            Stored with the lot on {formatDate(lot.createdAt, user.timeZone)} by {row.createdByName}
          </span>
        </div>
        <p className="text-sm" data-testid="plan-switching">
          <strong className="font-medium">{lot.inspectionSeverity[0].toUpperCase() + lot.inspectionSeverity.slice(1)} inspection</strong>, level {lot.plan.level}. Why: {lot.plan.switchingReason}
        </p>
        <PlanTable plan={lot.plan} verdict={verdict} />
        <CountingNote plan={lot.plan} lot={{ promisedGrade: lot.promisedGrade, cosmeticGrading: progress.cosmeticGrading, partTypeName: row.partTypeName }} />
      </section>

      <section className="card space-y-3 p-5" aria-labelledby="disposition-title">
        <h2 id="disposition-title" className="text-lg font-semibold">
          Disposition
        </h2>
        {lot.status === "decided" ? (
          <p className="text-sm" data-testid="disposition">
            <strong>{DISPOSITION_LABELS[lot.disposition!]}</strong> ({lot.verdict}) on {lot.decidedAt ? formatDate(lot.decidedAt, user.timeZone) : "—"}: {lot.dispositionReason}
          </p>
        ) : verdict.verdict === "pending" ? (
          <p className="text-sm text-gauge-700">The lead records the disposition once the verdict is reached.</p>
        ) : canDecide ? (
          <DispositionForm lotId={id} verdict={verdict.verdict} />
        ) : (
          <p className="text-sm text-gauge-700">Verdict reached ({verdict.verdict}); a QC lead records the disposition.</p>
        )}
      </section>

      {lot.status === "decided" && can(user, "evidence.send") && <EvidencePanel lotId={id} />}

      <section className="space-y-3" aria-labelledby="units-title">
        <h2 id="units-title" className="text-lg font-semibold">
          Units
        </h2>
        {lotUnits.length === 0 ? (
          canManage && lot.status === "open" ? (
            <UnitImport lotId={id} sampleSize={lot.plan.sampleSize} quantity={lot.quantity} />
          ) : (
            <p className="card p-4 text-sm text-gauge-700">No sampled units yet; a QC lead creates them from the serial list or as placeholders.</p>
          )
        ) : (
          <>
            <p className="text-xs text-gauge-600" data-testid="sample-draw">
              {lot.sampleDraw?.source === "serials"
                ? `Drawn at random from a list of ${lot.sampleDraw.poolSize} serials with seed ${lot.sampleDraw.seed} (${lot.sampleDraw.algorithm}); the same list and seed give the same sample.`
                : "Numbered placeholders: inspectors scan each unit's serial on the bench."}
            </p>
            <LotUnitsList
              units={lotUnits}
              checklistLength={row.checklistItemIds.length}
              defectsByUnit={can(user, "inspection.read") ? progress.defectsByUnit : new Map()}
              now={new Date()}
              benchLinks={can(user, "inspection.read")}
            />
          </>
        )}
      </section>

      <SwitchingBox supplierId={lot.supplierId} partTypeId={lot.partTypeId} view={next} canEdit={canManage} title={`Next lot of ${row.partTypeName} from ${row.supplierName}`} />
    </div>
  );
}
