import type { DefectClassDefinition, ViewDefinition } from "@/lib/part-types/schemas";
import type { MeasurementLabels } from "./measurement-table";

/** The names a measurement table shows for a part type's defect classes, zones and views (server or browser). */
export function measurementLabels(partType: { views: ViewDefinition[]; defectClasses: DefectClassDefinition[] }): MeasurementLabels {
  return {
    defects: Object.fromEntries(partType.defectClasses.map((d) => [d.key, d.label])),
    zones: Object.fromEntries(partType.views.flatMap((v) => v.zones.map((z) => [z.id, z.label]))),
    views: Object.fromEntries(partType.views.map((v) => [v.key, v.label])),
  };
}
