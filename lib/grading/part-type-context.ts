/**
 * What grading needs to know about a part type, derived from its row: the lists a rubric is
 * checked against (defect classes, zones, views), the severities behind the built-in critical
 * rule, and human labels for explanation lines.
 */
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { PartTypeLists } from "./rubric-schema";
import type { GradingLabels } from "./rule-text";
import type { DefectClassDefinition, ViewDefinition } from "@/lib/part-types/schemas";

export type GradingPartType = { views: ViewDefinition[]; defectClasses: DefectClassDefinition[] };

export type GradingContext = {
  lists: { defects: string[]; zones: string[]; views: string[] } & PartTypeLists;
  severities: Record<string, DefectSeverity>;
  labels: Required<GradingLabels>;
};

export function gradingContextOf(partType: GradingPartType): GradingContext {
  const zones: Record<string, string> = {};
  for (const view of partType.views) for (const zone of view.zones) zones[zone.id] ??= zone.label;
  return {
    lists: {
      defects: partType.defectClasses.map((d) => d.key),
      zones: Object.keys(zones),
      views: partType.views.map((v) => v.key),
    },
    severities: Object.fromEntries(partType.defectClasses.map((d) => [d.key, d.severity])),
    labels: {
      defects: Object.fromEntries(partType.defectClasses.map((d) => [d.key, d.label])),
      zones,
      views: Object.fromEntries(partType.views.map((v) => [v.key, v.label])),
    },
  };
}
