import type { Metadata } from "next";
import { SupplierForm } from "@/components/suppliers/supplier-form";
import { SupplierList } from "@/components/suppliers/supplier-list";
import { EmptyState } from "@/components/ui/empty-state";
import { getSetupCounts } from "@/db/queries/workspaces";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";

export const metadata: Metadata = { title: "Suppliers" };

export default async function SuppliersPage() {
  const user = await requirePageUser({ permission: "suppliers.review", from: "/suppliers" });
  const counts = await getSetupCounts({ workspaceId: user.workspaceId });
  const canEdit = can(user, "suppliers.edit");
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">Suppliers</h1>
        <p className="text-gauge-700">Who sends the parts. Scorecards arrive with the Reports screen.</p>
      </div>
      {counts.suppliers === 0 && (
        <EmptyState title="No suppliers yet" testId="suppliers-empty">
          {canEdit
            ? "Lots are received from a supplier, and evidence packs go to its contact. Add one with the form below: its name, a contact e-mail, and the grade its lots are bought at (A for new stock, B for refurbished pulls)."
            : "A QC lead adds the suppliers lots come from."}
        </EmptyState>
      )}
      {canEdit && <SupplierForm />}
      <SupplierList />
    </div>
  );
}
