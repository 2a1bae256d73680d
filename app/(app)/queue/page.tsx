import type { Metadata } from "next";
import { QueueBoard } from "@/components/queue/queue-board";
import { EmptyState } from "@/components/ui/empty-state";
import { listQueueFilterChoices } from "@/db/queries/queue";
import { getSetupCounts } from "@/db/queries/workspaces";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { screenByHref } from "@/lib/nav";
import { setupSteps } from "@/lib/workspace/setup";

const screen = screenByHref("/queue")!;
export const metadata: Metadata = { title: screen.label };

export default async function QueuePage() {
  const user = await requirePageUser({ role: screen.roles, from: screen.href });
  const ws = user.workspaceId;
  const [counts, choices] = await Promise.all([getSetupCounts({ workspaceId: ws }), listQueueFilterChoices({ workspaceId: ws })]);
  return (
    <div className="max-w-6xl space-y-4">
      <div>
        <h1 className="page-title">Queue</h1>
        <p className="text-gauge-700">Take next gives you the most urgent waiting unit (earliest due lot first) and reserves it for you while its Bench is open.</p>
      </div>
      {counts.units === 0 && (
        <EmptyState title="Nothing to inspect yet" steps={hasAnyRole(user.roles, "lead") ? setupSteps(counts).filter((s) => s.key === "lot") : []} testId="queue-empty">
          Units arrive here when a QC lead receives a lot and creates its sample (from the supplier&apos;s serial list or as numbered placeholders).
        </EmptyState>
      )}
      <QueueBoard options={{ partTypes: choices.partTypes, suppliers: choices.suppliers, lots: choices.openLots.map((l) => ({ id: l.id, label: `${l.purchaseRef} (due ${l.dueOn})` })) }} />
    </div>
  );
}
