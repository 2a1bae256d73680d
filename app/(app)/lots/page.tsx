import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";
import { LotFilters } from "@/components/lots/lot-filters";
import { LotTable } from "@/components/lots/lot-table";
import type { LotFilterOptions } from "@/components/lots/use-lot-list-params";
import { EmptyState } from "@/components/ui/empty-state";
import { Prefetched } from "@/components/ui/prefetched";
import { TableSkeleton } from "@/components/ui/table-skeleton";
import { listPartTypes } from "@/db/queries/part-types";
import { listSuppliers } from "@/db/queries/suppliers";
import { getSetupCounts } from "@/db/queries/workspaces";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { lotPage } from "@/lib/lots/list";
import { LOT_LIST_PAGE_KEYS, lotListAllowed, lotListParamsSchema } from "@/lib/lots/list-params";
import type { LotListQuery } from "@/lib/lots/schemas";
import { screenByHref } from "@/lib/nav";
import { lotKeys } from "@/lib/query-keys/lots";
import { readListParams } from "@/lib/url-state/list-params";
import { setupSteps } from "@/lib/workspace/setup";

const screen = screenByHref("/lots")!;
export const metadata: Metadata = { title: screen.label };

/** The list's first page, loaded on the server while the filters above it are already shown. */
async function FirstLotPage({ workspaceId, query, options }: { workspaceId: string; query: LotListQuery; options: LotFilterOptions }) {
  const page = await lotPage({ workspaceId, query });
  return (
    <Prefetched entries={[{ queryKey: lotKeys.list(query), data: page }]}>
      <LotTable options={options} />
    </Prefetched>
  );
}

export default async function LotsPage(props: PageProps<"/lots">) {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const [suppliers, partTypes, counts, search] = await Promise.all([
    listSuppliers({ workspaceId: user.workspaceId }),
    listPartTypes({ workspaceId: user.workspaceId }),
    getSetupCounts({ workspaceId: user.workspaceId }),
    props.searchParams,
  ]);
  const options: LotFilterOptions = { suppliers: suppliers.map((s) => ({ id: s.id, name: s.name })), partTypes: partTypes.map((p) => ({ id: p.id, name: p.name })) };
  // The same reading the browser makes of the URL (bad values fall back, and the filters say so).
  const { params } = readListParams(lotListParamsSchema, search, { allowed: lotListAllowed(options), pageKeys: LOT_LIST_PAGE_KEYS });
  const canReceive = can(user, "lots.manage");
  return (
    <div className="max-w-7xl space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="page-title">Lots</h1>
          <p className="text-gauge-700">{screen.summary}</p>
        </div>
        {canReceive && (
          <Link href="/lots/new" className="btn-primary">
            Receive a lot
          </Link>
        )}
      </div>
      {counts.lots === 0 && (
        <EmptyState
          title="No lots yet"
          steps={can(user, "workspace.manage") ? setupSteps(counts).filter((s) => s.key === "part-types" || s.key === "suppliers" || s.key === "lot") : []}
          testId="lots-empty"
        >
          {canReceive
            ? "A lot is a delivery from a supplier. Receiving it computes the ISO 2859-1 sample; its units then wait in the Queue."
            : "A QC lead receives lots from suppliers; they appear here, and their sampled units wait in the Queue."}
        </EmptyState>
      )}
      <LotFilters options={options} />
      <Suspense fallback={<TableSkeleton columns={9} rows={Math.min(params.pageSize, 10)} label="Loading lots…" />}>
        <FirstLotPage workspaceId={user.workspaceId} query={params} options={options} />
      </Suspense>
    </div>
  );
}
