import type { Metadata } from "next";
import Link from "next/link";
import { LotTable } from "@/components/lots/lot-table";
import { listPartTypes } from "@/db/queries/part-types";
import { listSuppliers } from "@/db/queries/suppliers";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/lots")!;
export const metadata: Metadata = { title: screen.label };

export default async function LotsPage() {
  const user = await requirePageUser({ role: screen.roles, from: screen.href });
  const [suppliers, partTypes] = await Promise.all([listSuppliers({ workspaceId: user.workspaceId }), listPartTypes({ workspaceId: user.workspaceId })]);
  return (
    <div className="max-w-7xl space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="page-title">Lots</h1>
          <p className="text-gauge-700">{screen.summary}</p>
        </div>
        {hasAnyRole(user.roles, "lead") && (
          <Link href="/lots/new" className="btn-primary">
            Receive a lot
          </Link>
        )}
      </div>
      <LotTable suppliers={suppliers.map((s) => ({ id: s.id, name: s.name }))} partTypes={partTypes.map((p) => ({ id: p.id, name: p.name }))} />
    </div>
  );
}
