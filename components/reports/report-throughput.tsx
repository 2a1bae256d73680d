import type { ThroughputReport } from "@/lib/reports/throughput";
import { figure, ReportTable } from "./report-table";

/** Units graded per day worked and median bench minutes per unit, per inspector and per part type. */
export function ReportThroughput({ report, userNames, partTypeNames }: { report: ThroughputReport; userNames: ReadonlyMap<string, string>; partTypeNames: ReadonlyMap<string, string> }) {
  if (report.desk.units === 0) return <p className="text-sm text-gauge-700">No unit was graded in this filter.</p>;
  const untimed = report.partTypes.reduce((sum, p) => sum + p.untimed, 0);
  return (
    <div className="space-y-4">
      <p className="text-sm" data-testid="desk-throughput">
        The desk graded <strong>{report.desk.units}</strong> units on {report.desk.daysWorked} working days: <strong>{figure(report.desk.unitsPerDay)}</strong> units per day.
      </p>
      <ReportTable
        caption="Throughput per inspector"
        testId="report-throughput"
        rows={report.inspectors}
        rowKey={(r) => r.graderId}
        columns={[
          { header: "Inspector", rowHeader: true, cell: (r) => userNames.get(r.graderId) ?? "Former member" },
          { header: "Units graded", numeric: true, cell: (r) => r.units },
          { header: "Days worked", numeric: true, cell: (r) => r.daysWorked },
          { header: "Units per day", numeric: true, cell: (r) => figure(r.unitsPerDay) },
          { header: "Median min / unit", numeric: true, cell: (r) => figure(r.medianMinutes) },
          { header: "By part type (median min)", cell: (r) => r.byPartType.map((p) => `${partTypeNames.get(p.partTypeId) ?? "?"} ${figure(p.medianMinutes)}`).join(" · ") },
        ]}
      />
      <ReportTable
        caption="Median minutes per unit by part type"
        rows={report.partTypes}
        rowKey={(r) => r.partTypeId}
        columns={[
          { header: "Part type", rowHeader: true, cell: (r) => partTypeNames.get(r.partTypeId) ?? "Unknown part type" },
          { header: "Units", numeric: true, cell: (r) => r.units },
          { header: "Timed", numeric: true, cell: (r) => r.timed },
          { header: "Median min / unit", numeric: true, cell: (r) => figure(r.medianMinutes) },
        ]}
      />
      <p className="text-xs text-gauge-600">
        Minutes run from taking a unit onto the bench to its grade, pauses in the queue left out.{" "}
        {untimed > 0 ? `${untimed} units could not be timed (a lapsed lease, or graded without a bench session) and are left out of the medians.` : ""}
      </p>
    </div>
  );
}
