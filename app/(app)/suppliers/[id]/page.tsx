import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getSupplier } from "@/db/queries/suppliers";
import { SupplierEvidence } from "@/components/evidence/supplier-evidence";
import { SupplierForm } from "@/components/suppliers/supplier-form";
import { SupplierScorecardSection } from "@/components/suppliers/supplier-scorecard";
import { requirePageUser } from "@/lib/auth/require-user";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Supplier" };

export default async function SupplierPage(props: PageProps<"/suppliers/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "suppliers.review", from: `/suppliers/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const supplier = await getSupplier({ workspaceId: user.workspaceId, supplierId: id });
  if (!supplier) notFound();
  return (
    <div className="max-w-6xl space-y-6">
      <Link href="/suppliers" className="text-sm text-gauge-600 underline">
        ← Suppliers
      </Link>
      <div>
        <h1 className="page-title">{supplier.name}</h1>
        <p className="text-gauge-700">
          {supplier.contactName ? `${supplier.contactName} · ` : ""}
          {supplier.contactEmail} · {supplier.active ? "active" : "inactive"} · lots bought at {supplier.promisedGrade ? `grade ${supplier.promisedGrade}` : "the part type's grade"}
        </p>
        {supplier.notes && <p className="mt-2 whitespace-pre-line text-sm">{supplier.notes}</p>}
      </div>
      {can(user, "reports.read") && <SupplierScorecardSection workspaceId={user.workspaceId} supplierId={supplier.id} timeZone={user.timeZone} />}
      {can(user, "evidence.send") && <SupplierEvidence supplierId={supplier.id} />}
      {can(user, "suppliers.edit") && (
        <SupplierForm
          supplierId={supplier.id}
          initial={{ name: supplier.name, contactName: supplier.contactName ?? "", contactEmail: supplier.contactEmail, notes: supplier.notes, promisedGrade: supplier.promisedGrade }}
        />
      )}
    </div>
  );
}
