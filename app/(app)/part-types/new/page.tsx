import type { Metadata } from "next";
import Link from "next/link";
import { PartTypeForm } from "@/components/part-types/part-type-form";
import { requirePageUser } from "@/lib/auth/require-user";

export const metadata: Metadata = { title: "New part type" };

export default async function NewPartTypePage() {
  await requirePageUser({ permission: "part-types.edit", from: "/part-types/new" });
  return (
    <div className="max-w-5xl space-y-6">
      <Link href="/part-types" className="text-sm text-gauge-600 underline">
        ← Part types
      </Link>
      <h1 className="page-title">New part type</h1>
      <PartTypeForm />
    </div>
  );
}
