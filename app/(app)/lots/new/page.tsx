import type { Metadata } from "next";
import Link from "next/link";
import { LotCreateForm } from "@/components/lots/lot-create-form";
import { listPartTypes } from "@/db/queries/part-types";
import { listSuppliers } from "@/db/queries/suppliers";
import { requirePageUser } from "@/lib/auth/require-user";

export const metadata: Metadata = { title: "Receive a lot" };

export default async function NewLotPage() {
  const user = await requirePageUser({ role: "lead", from: "/lots/new" });
  const [suppliers, partTypes] = await Promise.all([listSuppliers({ workspaceId: user.workspaceId }), listPartTypes({ workspaceId: user.workspaceId, active: true })]);
  return (
    <div className="max-w-5xl space-y-6">
      <Link href="/lots" className="text-sm text-gauge-600 underline">
        ← Lots
      </Link>
      <div>
        <h1 className="page-title">Receive a lot</h1>
        <p className="text-gauge-700">The sampling plan is computed from ISO 2859-1 and stored with the lot; the switching rules pick normal, tightened or reduced inspection.</p>
      </div>
      <LotCreateForm
        suppliers={suppliers.filter((s) => s.active).map((s) => ({ id: s.id, name: s.name, promisedGrade: s.promisedGrade }))}
        partTypes={partTypes.map((p) => ({ id: p.id, name: p.name, modelFamily: p.modelFamily, inspectAll: p.inspectAll, promisedGrade: p.promisedGrade }))}
        canEditSwitching
      />
    </div>
  );
}
