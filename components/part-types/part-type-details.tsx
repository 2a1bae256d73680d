import type { PartType } from "@/db/schema/lots";
import { DefectSeverityBadge } from "@/components/lots/badges";
import { describeLimits } from "@/lib/checklist/evaluate";

/** A part type as the bench sees it: views and zones, defect classes and the checklist. */
export function PartTypeDetails({ partType }: { partType: PartType }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <section className="card p-4" aria-labelledby="views-title">
        <h2 id="views-title" className="mb-2 font-semibold">
          Views and zones
        </h2>
        <ul className="space-y-2 text-sm">
          {partType.views.map((v) => (
            <li key={v.key}>
              <span className="font-medium">{v.label}</span>{" "}
              <span className="text-xs text-gauge-600">
                ({v.key}
                {v.required ? ", required" : ""})
              </span>
              {v.instructions && <p className="text-gauge-700">{v.instructions}</p>}
              {v.zones.length > 0 && <p className="text-xs text-gauge-600">Zones: {v.zones.map((z) => z.label).join(", ")}</p>}
            </li>
          ))}
        </ul>
      </section>
      <section className="card p-4" aria-labelledby="defects-title">
        <h2 id="defects-title" className="mb-2 font-semibold">
          Defect classes
        </h2>
        <ul className="grid grid-cols-2 gap-1 text-sm">
          {partType.defectClasses.map((d) => (
            <li key={d.key} className="flex items-center gap-2">
              {d.label} <DefectSeverityBadge severity={d.severity} />
            </li>
          ))}
        </ul>
      </section>
      <section className="card p-4 lg:col-span-2" aria-labelledby="checklist-title">
        <h2 id="checklist-title" className="mb-2 font-semibold">
          Functional checklist
        </h2>
        <ol className="list-decimal space-y-1 pl-5 text-sm">
          {partType.checklist.map((item) => (
            <li key={item.id}>
              {item.label}{" "}
              <span className="text-xs text-gauge-600">
                {item.kind === "numeric" ? describeLimits(item) : item.kind === "choice" ? item.options.map((o) => `${o.label}${o.passes ? "" : " ✗"}`).join(" / ") : "pass / fail"}
              </span>{" "}
              <DefectSeverityBadge severity={item.severityOnFail} />
              {item.caution && <p className="text-xs text-signal-700">{item.caution}</p>}
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
