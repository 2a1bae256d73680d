import type { Metadata } from "next";
import { Suspense } from "react";
import { QueueBoard } from "@/components/queue/queue-board";
import { QueueList } from "@/components/queue/queue-list";
import { EmptyState } from "@/components/ui/empty-state";
import { Prefetched } from "@/components/ui/prefetched";
import { TableSkeleton } from "@/components/ui/table-skeleton";
import { listQueueFilterChoices } from "@/db/queries/queue";
import { getSetupCounts } from "@/db/queries/workspaces";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";
import { listQueue } from "@/lib/queue/list";
import { QUEUE_LIST_PAGE_KEYS, queueListAllowed, queueListParamsSchema, type QueueFilterOptions, type QueueListParams } from "@/lib/queue/list-params";
import { queueKeys } from "@/lib/query-keys/queue";
import { QUEUE_PAGE_SIZE } from "@/lib/queue/schemas";
import { readListParams } from "@/lib/url-state/list-params";
import { setupSteps } from "@/lib/workspace/setup";

const screen = screenByHref("/queue")!;
export const metadata: Metadata = { title: screen.label };

/** The list's first page (or the linked page), loaded on the server while the controls above it are already shown. */
async function FirstQueuePage({ workspaceId, params, options }: { workspaceId: string; params: QueueListParams; options: QueueFilterOptions }) {
  const { cursor, before, page: _page, ...filters } = params;
  const page = await listQueue({ workspaceId, filters, cursor, before, limit: QUEUE_PAGE_SIZE });
  return (
    <Prefetched entries={[{ queryKey: queueKeys.list(params), data: page }]}>
      <QueueList options={options} />
    </Prefetched>
  );
}

export default async function QueuePage(props: PageProps<"/queue">) {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const ws = user.workspaceId;
  const [counts, choices, search] = await Promise.all([getSetupCounts({ workspaceId: ws }), listQueueFilterChoices({ workspaceId: ws }), props.searchParams]);
  const options: QueueFilterOptions = { partTypes: choices.partTypes, suppliers: choices.suppliers, lots: choices.openLots.map((l) => ({ id: l.id, label: `${l.purchaseRef} (due ${l.dueOn})` })) };
  // The same reading the browser makes of the URL (bad values fall back, and the controls say so).
  const { params } = readListParams(queueListParamsSchema, search, { allowed: queueListAllowed(options), pageKeys: QUEUE_LIST_PAGE_KEYS });
  return (
    <div className="max-w-6xl space-y-4">
      <div>
        <h1 className="page-title">Queue</h1>
        <p className="text-gauge-700">Take next gives you the most urgent waiting unit (earliest due lot first) and reserves it for you while its Bench is open.</p>
      </div>
      {counts.units === 0 && (
        <EmptyState title="Nothing to inspect yet" steps={can(user, "workspace.manage") ? setupSteps(counts).filter((s) => s.key === "lot") : []} testId="queue-empty">
          Units arrive here when a QC lead receives a lot and creates its sample (from the supplier&apos;s serial list or as numbered placeholders).
        </EmptyState>
      )}
      <QueueBoard options={options} />
      <Suspense fallback={<TableSkeleton columns={6} rows={10} label="Loading the queue…" />}>
        <FirstQueuePage workspaceId={ws} params={params} options={options} />
      </Suspense>
    </div>
  );
}
