import type { Metadata } from "next";
import { Suspense } from "react";
import { ReportFilters, type ReportFilterOptions } from "@/components/reports/report-filters";
import { ReportGrades } from "@/components/reports/report-grades";
import { ReportLots } from "@/components/reports/report-lots";
import { ReportScorecards } from "@/components/reports/report-scorecards";
import { ReportThroughput } from "@/components/reports/report-throughput";
import { TableSkeleton } from "@/components/ui/table-skeleton";
import { listPartTypes } from "@/db/queries/part-types";
import { userNames } from "@/db/queries/reports";
import { listSuppliers } from "@/db/queries/suppliers";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";
import { EXPORT_KINDS, EXPORT_LABELS, exportHref, REPORT_PAGE_KEYS, reportAllowed, reportParamsSchema, type ReportFilter, type ReportParams } from "@/lib/reports/filters";
import { loadGradeDistribution, loadSupplierScorecards, loadThroughput } from "@/lib/reports/overview";
import { GRADE_CAUTION } from "@/lib/reports/format";
import { loadOpenClaimCounts } from "@/lib/reports/supplier-follow-up";
import { listParamsSearch, readListParams, type RawSearchParams } from "@/lib/url-state/list-params";

const screen = screenByHref("/reports")!;
export const metadata: Metadata = { title: screen.label };

type Scope = { workspaceId: string; filter: ReportFilter; timeZone: string };

/** A GET form sends every field; an empty one ("All suppliers") means no filter, not a bad value. */
function withoutEmpty(raw: Record<string, string | string[] | undefined>): RawSearchParams {
  return Object.fromEntries(Object.entries(raw).filter(([, v]) => v !== "" && !(Array.isArray(v) && v.every((one) => one === ""))));
}

async function Scorecards({ scope, classLabels, supplierNames }: { scope: Scope; classLabels: Record<string, string>; supplierNames: Map<string, string> }) {
  const [scorecards, openClaims] = await Promise.all([loadSupplierScorecards(scope, classLabels), loadOpenClaimCounts({ workspaceId: scope.workspaceId })]);
  return <ReportScorecards scorecards={scorecards} supplierNames={supplierNames} openClaims={openClaims} />;
}

async function Grades({ scope, period, partTypeNames }: { scope: Scope; period: ReportParams["period"]; partTypeNames: Map<string, string> }) {
  return <ReportGrades distributions={await loadGradeDistribution(scope, period)} partTypeNames={partTypeNames} period={period} />;
}

async function Throughput({ scope, partTypeNames }: { scope: Scope; partTypeNames: Map<string, string> }) {
  const report = await loadThroughput(scope);
  const names = await userNames({ workspaceId: scope.workspaceId, userIds: report.inspectors.map((i) => i.graderId) });
  return <ReportThroughput report={report} userNames={names} partTypeNames={partTypeNames} />;
}

function Section({ id, title, children }: { id: string; title: string; children: React.ReactNode }) {
  return (
    <section className="card space-y-3 p-5" aria-labelledby={`${id}-title`}>
      <h2 id={`${id}-title`} className="text-lg font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

export default async function ReportsPage(props: PageProps<"/reports">) {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const [suppliers, partTypes, search] = await Promise.all([listSuppliers({ workspaceId: user.workspaceId }), listPartTypes({ workspaceId: user.workspaceId }), props.searchParams]);
  const options: ReportFilterOptions = { suppliers: suppliers.map((s) => ({ id: s.id, name: s.name })), partTypes: partTypes.map((p) => ({ id: p.id, name: p.name })) };
  const { params, ignored } = readListParams(reportParamsSchema, withoutEmpty(search), { allowed: reportAllowed(options), pageKeys: REPORT_PAGE_KEYS });
  const filter: ReportFilter = { supplierId: params.supplierId, partTypeId: params.partTypeId, from: params.from, to: params.to };
  const scope: Scope = { workspaceId: user.workspaceId, filter, timeZone: user.timeZone };
  const supplierNames = new Map(suppliers.map((s) => [s.id, s.name]));
  const partTypeNames = new Map(partTypes.map((p) => [p.id, p.name]));
  const classLabels: Record<string, string> = {};
  for (const p of partTypes) for (const c of p.defectClasses) classLabels[c.key] ??= c.label;
  const pageHref = (page: number) => `/reports${listParamsSearch(reportParamsSchema, { ...params, page })}#lots`;

  return (
    <div className="max-w-7xl space-y-6">
      <div>
        <h1 className="page-title">Reports</h1>
        <p className="text-gauge-700">{screen.summary}</p>
      </div>
      <ReportFilters params={params} ignored={ignored} options={options} />

      <Section id="exports" title="CSV exports">
        <p className="text-sm text-gauge-700">For the filter above: UTF-8 with a header row, dates in ISO 8601 (UTC). Large exports stream as they download.</p>
        <ul className="grid gap-2 text-sm sm:grid-cols-2">
          {EXPORT_KINDS.map((kind) => (
            <li key={kind}>
              <a className="font-medium text-gauge-700 underline" href={exportHref(kind, filter)} download data-testid={`export-${kind}`}>
                {EXPORT_LABELS[kind]}
              </a>
            </li>
          ))}
        </ul>
      </Section>

      <div id="lots">
        <Section id="lot-reports" title="Lot inspection reports">
          <Suspense fallback={<TableSkeleton columns={7} rows={6} label="Loading lots…" />}>
            <ReportLots workspaceId={user.workspaceId} filter={filter} page={params.page} pageHref={pageHref} />
          </Suspense>
        </Section>
      </div>

      <Section id="scorecards" title="Supplier scorecards">
        <Suspense fallback={<TableSkeleton columns={10} rows={4} label="Loading scorecards…" />}>
          <Scorecards scope={scope} classLabels={classLabels} supplierNames={supplierNames} />
        </Suspense>
        <p className="text-xs text-gauge-600">Defectives per 100 units inspected, from the counts each lot&apos;s decision recorded (open lots add theirs once decided). {GRADE_CAUTION}</p>
      </Section>

      <Section id="grades" title={`Grade distribution per part type and ${params.period}`}>
        <Suspense fallback={<TableSkeleton columns={6} rows={4} label="Loading grades…" />}>
          <Grades scope={scope} period={params.period} partTypeNames={partTypeNames} />
        </Suspense>
      </Section>

      <Section id="throughput" title="Inspector throughput">
        <Suspense fallback={<TableSkeleton columns={6} rows={4} label="Loading throughput…" />}>
          <Throughput scope={scope} partTypeNames={partTypeNames} />
        </Suspense>
      </Section>
    </div>
  );
}
