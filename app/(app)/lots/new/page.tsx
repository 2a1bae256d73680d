import type { Metadata } from "next";
import Link from "next/link";
import { LotCreateForm } from "@/components/lots/lot-create-form";
import { EmptyState } from "@/components/ui/empty-state";
import { listPartTypes } from "@/db/queries/part-types";
import { listSuppliers } from "@/db/queries/suppliers";
import { getSetupCounts } from "@/db/queries/workspaces";
import { requirePageUser } from "@/lib/auth/require-user";
import { setupSteps } from "@/lib/workspace/setup";

export const metadata: Metadata = { title: "Receive a lot" };

export default async function NewLotPage() {
  const user = await requirePageUser({ permission: "lots.manage", from: "/lots/new" });
  const [suppliers, partTypes, counts] = await Promise.all([
    listSuppliers({ workspaceId: user.workspaceId }),
    listPartTypes({ workspaceId: user.workspaceId, active: true }),
    getSetupCounts({ workspaceId: user.workspaceId }),
  ]);
  const activeSuppliers = suppliers.filter((s) => s.active);
  // Without an active supplier and part type there is nothing to choose: say what to do instead.
  const missing = setupSteps(counts).filter((s) => (s.key === "part-types" && partTypes.length === 0) || (s.key === "suppliers" && activeSuppliers.length === 0));
  return (
    <div className="max-w-5xl space-y-6">
      <Link href="/lots" className="text-sm text-gauge-600 underline">
        ← Lots
      </Link>
      <div>
        <h1 className="page-title">Receive a lot</h1>
        <p className="text-gauge-700">The sampling plan is computed from ISO 2859-1 and stored with the lot; the switching rules pick normal, tightened or reduced inspection.</p>
      </div>
      {missing.length > 0 ? (
        <EmptyState title="Before you can receive a lot" steps={missing} testId="receive-lot-empty">
          A lot comes from a supplier and is of one part type;{" "}
          {missing.length === 2 ? "there are none yet" : activeSuppliers.length === 0 ? "there is no active supplier yet" : "there is no active part type yet"}.
        </EmptyState>
      ) : (
        <LotCreateForm
          suppliers={activeSuppliers.map((s) => ({ id: s.id, name: s.name, promisedGrade: s.promisedGrade }))}
          partTypes={partTypes.map((p) => ({ id: p.id, name: p.name, modelFamily: p.modelFamily, inspectAll: p.inspectAll, promisedGrade: p.promisedGrade }))}
          canEditSwitching
        />
      )}
    </div>
  );
}
