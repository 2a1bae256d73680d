import type { Metadata } from "next";
import Link from "next/link";
import { BatteryCaution, GradeScopeNote, StaticCaution } from "@/components/ui/cautions";
import { EmptyState } from "@/components/ui/empty-state";
import { getSetupCounts } from "@/db/queries/workspaces";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { localInboxDir } from "@/lib/env";
import { screensFor } from "@/lib/nav";
import { setupSteps } from "@/lib/workspace/setup";

export const metadata: Metadata = { title: "Home" };

export default async function HomePage() {
  const user = await requirePageUser({ from: "/" });
  const screens = screensFor(user.roles, { outbox: Boolean(localInboxDir()) });
  const steps = can(user, "workspace.manage") ? setupSteps(await getSetupCounts({ workspaceId: user.workspaceId })) : [];
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">Good to see you, {user.name.split(" ")[0]}</h1>
        <p className="text-gauge-700">{user.workspaceName} · your screens</p>
      </div>
      {steps.some((s) => !s.done) && (
        <EmptyState title="Getting started" steps={steps} testId="getting-started">
          Set up the desk in this order; each step links to its screen. This list goes away once everything is done.
        </EmptyState>
      )}
      <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {screens.map((s) => (
          <li key={s.href}>
            <Link href={s.href} className="card block h-full p-4 hover:border-gauge-400">
              <div className="flex items-center justify-between">
                <span className="font-semibold">{s.label}</span>
                {s.status === "planned" && <span className="rounded bg-gauge-100 px-1.5 py-0.5 text-xs text-gauge-700">planned</span>}
              </div>
              <p className="mt-1 text-sm text-gauge-700">{s.summary}</p>
            </Link>
          </li>
        ))}
      </ul>
      <section aria-labelledby="cautions" className="space-y-2">
        <h2 id="cautions" className="text-sm font-semibold uppercase tracking-wide text-gauge-600">
          Bench cautions
        </h2>
        <BatteryCaution />
        <StaticCaution />
        <GradeScopeNote />
      </section>
    </div>
  );
}
