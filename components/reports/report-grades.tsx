import { GRADES } from "@/lib/grading/rubric-schema";
import type { GradeDistribution } from "@/lib/reports/grade-distribution";
import { percent, ReportTable } from "./report-table";

/** Per part type: how many units got each grade per week or month, with shares of the period. */
export function ReportGrades({ distributions, partTypeNames, period }: { distributions: GradeDistribution[]; partTypeNames: ReadonlyMap<string, string>; period: "week" | "month" }) {
  if (distributions.length === 0) return <p className="text-sm text-gauge-700">No unit was graded in this filter.</p>;
  return (
    <div className="space-y-5">
      {distributions.map((d) => {
        const name = partTypeNames.get(d.partTypeId) ?? "Unknown part type";
        const rows = [...d.periods, { period: "Total", ...d.total }];
        return (
          <div key={d.partTypeId} className="space-y-2" data-testid={`grades-${d.partTypeId}`}>
            <h3 className="font-medium">
              {name} <span className="text-sm font-normal text-gauge-600">· {d.total.total} units graded</span>
            </h3>
            <ReportTable
              caption={`Grades of ${name} per ${period}`}
              rows={rows}
              rowKey={(r) => r.period}
              columns={[
                { header: period === "week" ? "Week of" : "Month", rowHeader: true, cell: (r) => (r.period === "Total" ? "Total" : period === "month" ? r.period.slice(0, 7) : r.period) },
                ...GRADES.map((grade) => ({ header: grade, numeric: true, cell: (r: (typeof rows)[number]) => (r.counts[grade] === 0 ? "0" : `${r.counts[grade]} (${percent(r.shares[grade])})`) })),
                { header: "Units", numeric: true, cell: (r) => r.total },
              ]}
            />
          </div>
        );
      })}
      <p className="text-xs text-gauge-600">Each unit counts once, with its current grade (after any override), in the period it was first graded.</p>
    </div>
  );
}
