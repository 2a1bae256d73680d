import type { Metadata } from "next";
import Link from "next/link";
import { AddStartersForm } from "@/components/part-types/add-starters-form";
import { EmptyState } from "@/components/ui/empty-state";
import { listPartTypes } from "@/db/queries/part-types";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";
import { CATEGORY_LABELS, type PartCategory } from "@/lib/part-types/schemas";
import { STARTER_CHOICES } from "@/lib/part-types/starters";

const screen = screenByHref("/part-types")!;
export const metadata: Metadata = { title: screen.label };

export default async function PartTypesPage() {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const partTypes = await listPartTypes({ workspaceId: user.workspaceId });
  const canEdit = can(user, "part-types.edit");
  return (
    <div className="max-w-5xl space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="page-title">Part types</h1>
          <p className="text-gauge-700">{screen.summary}</p>
        </div>
        {canEdit && (
          <Link href="/part-types/new" className="btn-primary">
            New part type
          </Link>
        )}
      </div>
      {partTypes.length === 0 && (
        <EmptyState title="No part types yet">
          <p className="mb-3">
            A part type says what the Bench asks for: the views to photograph and their zones, the defect classes and how serious each is, and the functional checklist.{" "}
            {canEdit ? "Start from the examples below (each with an example rubric as a draft, to adapt before you publish it), or make your own with New part type." : "A QC lead adds them."}
          </p>
          {canEdit && <AddStartersForm choices={STARTER_CHOICES} />}
        </EmptyState>
      )}
      <div className="card overflow-x-auto">
        <table className="min-w-full text-sm" data-testid="part-type-table">
          <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
            <tr>
              <th scope="col" className="px-4 py-2">
                Part type
              </th>
              <th scope="col" className="px-4 py-2">
                Category
              </th>
              <th scope="col" className="px-4 py-2">
                Model family
              </th>
              <th scope="col" className="px-4 py-2">
                Views
              </th>
              <th scope="col" className="px-4 py-2">
                Checklist
              </th>
              <th scope="col" className="px-4 py-2">
                Sampling
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-gauge-100">
            {partTypes.map((p) => (
              <tr key={p.id} className={p.active ? "" : "text-gauge-500"}>
                <td className="px-4 py-2">
                  <Link href={`/part-types/${p.id}`} className="font-medium text-gauge-700 underline">
                    {p.name}
                  </Link>
                  {!p.active && " (retired)"}
                </td>
                <td className="px-4 py-2">{CATEGORY_LABELS[p.category as PartCategory] ?? p.category}</td>
                <td className="px-4 py-2">{p.modelFamily || "—"}</td>
                <td className="px-4 py-2">{p.views.map((v) => v.label).join(", ")}</td>
                <td className="px-4 py-2 tabular-nums">{p.checklist.length} items</td>
                <td className="whitespace-nowrap px-4 py-2">{p.inspectAll ? "100 %" : "ISO 2859-1"}</td>
              </tr>
            ))}
            {partTypes.length === 0 && (
              <tr>
                <td colSpan={6} className="px-4 py-6 text-center text-gauge-600">
                  No part types yet.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
