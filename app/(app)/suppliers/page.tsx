import type { Metadata } from "next";
import { SupplierForm } from "@/components/suppliers/supplier-form";
import { SupplierList } from "@/components/suppliers/supplier-list";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { screenByHref } from "@/lib/nav";

export const metadata: Metadata = { title: "Suppliers" };

export default async function SuppliersPage() {
  const user = await requirePageUser({ role: screenByHref("/suppliers")!.roles, from: "/suppliers" });
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">Suppliers</h1>
        <p className="text-gauge-700">Who sends the parts. Scorecards arrive with the Reports screen.</p>
      </div>
      {hasAnyRole(user.roles, "lead") && <SupplierForm />}
      <SupplierList />
    </div>
  );
}
