import type { Metadata } from "next";
import { SupplierForm } from "@/components/suppliers/supplier-form";
import { SupplierList } from "@/components/suppliers/supplier-list";
import { EmptyState } from "@/components/ui/empty-state";
import { getSetupCounts } from "@/db/queries/workspaces";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { screenByHref } from "@/lib/nav";

export const metadata: Metadata = { title: "Suppliers" };

export default async function SuppliersPage() {
  const user = await requirePageUser({ role: screenByHref("/suppliers")!.roles, from: "/suppliers" });
  const counts = await getSetupCounts({ workspaceId: user.workspaceId });
  const isLead = hasAnyRole(user.roles, "lead");
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">Suppliers</h1>
        <p className="text-gauge-700">Who sends the parts. Scorecards arrive with the Reports screen.</p>
      </div>
      {counts.suppliers === 0 && (
        <EmptyState title="No suppliers yet" testId="suppliers-empty">
          {isLead
            ? "Lots are received from a supplier, and evidence packs go to its contact. Add one with the form below: its name, a contact e-mail, and the grade its lots are bought at (A for new stock, B for refurbished pulls)."
            : "A QC lead adds the suppliers lots come from."}
        </EmptyState>
      )}
      {isLead && <SupplierForm />}
      <SupplierList />
    </div>
  );
}
