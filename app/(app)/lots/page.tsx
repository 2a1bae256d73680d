import type { Metadata } from "next";
import Link from "next/link";
import { LotTable } from "@/components/lots/lot-table";
import { EmptyState } from "@/components/ui/empty-state";
import { listPartTypes } from "@/db/queries/part-types";
import { listSuppliers } from "@/db/queries/suppliers";
import { getSetupCounts } from "@/db/queries/workspaces";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { screenByHref } from "@/lib/nav";
import { setupSteps } from "@/lib/workspace/setup";

const screen = screenByHref("/lots")!;
export const metadata: Metadata = { title: screen.label };

export default async function LotsPage() {
  const user = await requirePageUser({ role: screen.roles, from: screen.href });
  const [suppliers, partTypes, counts] = await Promise.all([listSuppliers({ workspaceId: user.workspaceId }), listPartTypes({ workspaceId: user.workspaceId }), getSetupCounts({ workspaceId: user.workspaceId })]);
  const isLead = hasAnyRole(user.roles, "lead");
  return (
    <div className="max-w-7xl space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="page-title">Lots</h1>
          <p className="text-gauge-700">{screen.summary}</p>
        </div>
        {isLead && (
          <Link href="/lots/new" className="btn-primary">
            Receive a lot
          </Link>
        )}
      </div>
      {counts.lots === 0 && (
        <EmptyState title="No lots yet" steps={isLead ? setupSteps(counts).filter((s) => s.key === "part-types" || s.key === "suppliers" || s.key === "lot") : []} testId="lots-empty">
          {isLead
            ? "A lot is a delivery from a supplier. Receiving it computes the ISO 2859-1 sample; its units then wait in the Queue."
            : "A QC lead receives lots from suppliers; they appear here, and their sampled units wait in the Queue."}
        </EmptyState>
      )}
      <LotTable suppliers={suppliers.map((s) => ({ id: s.id, name: s.name }))} partTypes={partTypes.map((p) => ({ id: p.id, name: p.name }))} />
    </div>
  );
}
