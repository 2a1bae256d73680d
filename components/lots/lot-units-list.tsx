import Link from "next/link";
import type { LotUnitRow } from "@/db/queries/units";
import type { FindingDefect } from "@/lib/lots/verdict";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import { DefectSeverityBadge } from "./badges";

/** "on Ines's bench" only while the lease runs; an expired lease means the unit is waiting again. */
export function unitStatusText(u: Pick<LotUnitRow, "status" | "leaseHolderName" | "leaseExpiresAt">, now: Date): string {
  if (u.status !== "on_bench") return STATUS_LABELS[u.status];
  if (u.leaseExpiresAt && u.leaseExpiresAt > now) return `on ${u.leaseHolderName ?? "a"}'s bench`;
  return "waiting (lease ran out)";
}

/** The cosmetic nonconformities a unit counts as, one badge per severity with its reason. */
function CosmeticCell({ defects }: { defects: readonly FindingDefect[] }) {
  const cosmetic = defects.filter((d) => d.source === "cosmetic");
  if (cosmetic.length === 0) return <span className="text-gauge-500">—</span>;
  return (
    <ul className="space-y-0.5">
      {cosmetic.map((d) => (
        <li key={d.severity} className="flex items-center gap-1">
          <DefectSeverityBadge severity={d.severity} />
          <span className="text-xs text-gauge-700">{d.label}</span>
        </li>
      ))}
    </ul>
  );
}

/** The lot's sampled units in sample order, each linking to its Bench page for those who may open it. */
export function LotUnitsList({
  units,
  checklistLength,
  defectsByUnit,
  now,
  benchLinks,
}: {
  units: LotUnitRow[];
  checklistLength: number;
  defectsByUnit: ReadonlyMap<string, FindingDefect[]>;
  now: Date;
  benchLinks: boolean;
}) {
  return (
    <div className="card overflow-x-auto">
      <table className="min-w-full text-sm" data-testid="lot-units">
        <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
          <tr>
            <th scope="col" className="px-3 py-2">
              #
            </th>
            <th scope="col" className="px-3 py-2">
              Serial
            </th>
            <th scope="col" className="px-3 py-2">
              Status
            </th>
            <th scope="col" className="px-3 py-2">
              Checklist
            </th>
            <th scope="col" className="px-3 py-2">
              Failures
            </th>
            <th scope="col" className="px-3 py-2">
              Grade
            </th>
            <th scope="col" className="px-3 py-2">
              Cosmetic count
            </th>
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
              <td className="px-3 py-1.5">
                {u.failed > 0 && u.worstFailure ? (
                  <span className="flex items-center gap-1">
                    {u.failed} <DefectSeverityBadge severity={u.worstFailure} />
                  </span>
                ) : (
                  <span className="text-gauge-500">—</span>
                )}
              </td>
              <td className="px-3 py-1.5 font-medium" data-testid={`unit-grade-${u.sampleIndex}`}>
                {u.grade ?? <span className="font-normal text-gauge-500">—</span>}
              </td>
              <td className="px-3 py-1.5" data-testid={`unit-cosmetic-${u.sampleIndex}`}>
                <CosmeticCell defects={defectsByUnit.get(u.id) ?? []} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
