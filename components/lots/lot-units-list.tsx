import Link from "next/link";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import type { UnitStatus } from "@/db/schema/lots";
import { DefectSeverityBadge } from "./badges";

export type LotUnitRow = {
  id: string;
  sampleIndex: number;
  serial: string | null;
  placeholder: boolean;
  status: UnitStatus;
  leaseHolderName: string | null;
  leaseExpiresAt: Date | null;
  recorded: number;
  failed: number;
  worstFailure: "critical" | "major" | "minor" | null;
};

/** "on Ines's bench" only while the lease runs; an expired lease means the unit is waiting again. */
export function unitStatusText(u: Pick<LotUnitRow, "status" | "leaseHolderName" | "leaseExpiresAt">, now: Date): string {
  if (u.status !== "on_bench") return STATUS_LABELS[u.status];
  if (u.leaseExpiresAt && u.leaseExpiresAt > now) return `on ${u.leaseHolderName ?? "a"}'s bench`;
  return "waiting (lease ran out)";
}

/** The lot's sampled units in sample order, each linking to its Bench page for those who may open it. */
export function LotUnitsList({ units, checklistLength, now, benchLinks }: { units: LotUnitRow[]; checklistLength: number; now: Date; benchLinks: boolean }) {
  return (
    <div className="card overflow-x-auto">
      <table className="min-w-full text-sm" data-testid="lot-units">
        <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
          <tr>
            <th scope="col" className="px-3 py-2">#</th>
            <th scope="col" className="px-3 py-2">Serial</th>
            <th scope="col" className="px-3 py-2">Status</th>
            <th scope="col" className="px-3 py-2">Checklist</th>
            <th scope="col" className="px-3 py-2">Failures</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-gauge-100">
          {units.map((u) => (
            <tr key={u.id} data-testid={`unit-row-${u.sampleIndex}`}>
              <td className="px-3 py-1.5 tabular-nums text-gauge-600">{u.sampleIndex}</td>
              <td className="px-3 py-1.5">
                {benchLinks ? (
                  <Link href={`/units/${u.id}`} className="font-mono text-gauge-700 underline">
                    {u.serial ?? `Unit ${u.sampleIndex} (serial to scan)`}
                  </Link>
                ) : (
                  <span className="font-mono text-gauge-700">{u.serial ?? `Unit ${u.sampleIndex} (serial to scan)`}</span>
                )}
              </td>
              <td className="px-3 py-1.5">{unitStatusText(u, now)}</td>
              <td className="px-3 py-1.5 tabular-nums">
                {Math.min(u.recorded, checklistLength)} / {checklistLength}
              </td>
              <td className="px-3 py-1.5">{u.failed > 0 && u.worstFailure ? <span className="flex items-center gap-1">{u.failed} <DefectSeverityBadge severity={u.worstFailure} /></span> : <span className="text-gauge-500">—</span>}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
