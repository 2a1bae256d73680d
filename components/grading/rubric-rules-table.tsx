import type { Rubric } from "@/lib/grading/rubric-schema";
import { describeRule } from "@/lib/grading/rule-text";
import { GradeBadge } from "./grade-badge";
import type { PartTypeSummary } from "./types";

/** A published (or read-only) version's rules, one readable sentence each. */
export function RubricRulesTable({ rubric, partType }: { rubric: Rubric; partType: PartTypeSummary }) {
  return (
    <div className="space-y-3">
      {rubric.rules.length === 0 ? (
        <p className="text-sm text-gauge-700">This version has no rules.</p>
      ) : (
        <div className="card overflow-x-auto">
          <table className="min-w-full text-sm" data-testid="rubric-rules">
            <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
              <tr>
                <th scope="col" className="px-3 py-2 font-medium">
                  Rule
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  Condition
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  Grade
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-gauge-100">
              {rubric.rules.map((rule) => (
                <tr key={rule.id}>
                  <td className="whitespace-nowrap px-3 py-1.5 font-mono text-xs text-gauge-700">{rule.id}</td>
                  <td className="px-3 py-1.5">{describeRule(rule, partType.labels).replace(/ → \S+$/, "")}</td>
                  <td className="px-3 py-1.5">
                    <GradeBadge grade={rule.grade} size="sm" />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {(rubric.notes ?? []).length > 0 && (
        <ul className="list-disc space-y-0.5 pl-5 text-sm text-gauge-700">
          {rubric.notes!.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
