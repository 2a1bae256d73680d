/**
 * The part type editor's form values (text where people type lists) and their conversion to and
 * from the API's shape. Pure; the result is validated with partTypeSchema before it is sent.
 *
 * Text formats: zones one per line "id | Label | x,y x,y x,y" (0..1 of the Surface's bounding box);
 * choices one per line "value | Label | pass" (or "fail").
 */
import type { PartType } from "@/db/schema/lots";
import type { PromisedGrade } from "@/lib/lots/schemas";
import type { PartCategory } from "./schemas";
import type { ChecklistItem } from "@/lib/part-types/schemas";

export type ItemForm = {
  id: string;
  label: string;
  kind: ChecklistItem["kind"];
  severityOnFail: ChecklistItem["severityOnFail"];
  caution: string;
  unit: string;
  min: string;
  max: string;
  decimals: string;
  suspectBelow: string;
  options: string;
};
export type PartTypeFormValues = {
  name: string;
  category: PartCategory;
  modelFamily: string;
  inspectAll: boolean;
  promisedGrade: PromisedGrade;
  active: boolean;
  nominalWidth: string;
  nominalHeight: string;
  panelWidth: string;
  panelHeight: string;
  defectClasses: { key: string; label: string; severity: ChecklistItem["severityOnFail"] }[];
  checklist: ItemForm[];
  views: { key: string; label: string; required: boolean; instructions: string; zones: string }[];
};

export const EMPTY_ITEM: ItemForm = { id: "", label: "", kind: "pass_fail", severityOnFail: "major", caution: "", unit: "", min: "", max: "", decimals: "0", suspectBelow: "", options: "" };

export const EMPTY_PART_TYPE: PartTypeFormValues = {
  name: "",
  category: "other",
  modelFamily: "",
  inspectAll: false,
  promisedGrade: "A",
  active: true,
  nominalWidth: "",
  nominalHeight: "",
  panelWidth: "",
  panelHeight: "",
  defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
  checklist: [],
  views: [{ key: "front", label: "Front", required: true, instructions: "", zones: "body | Body | 0,0 1,0 1,1 0,1" }],
};

const num = (text: string): number | null | string => {
  const t = text.trim().replace(",", ".");
  if (t === "") return null;
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : text;
};
const size = (w: string, h: string) => {
  const width = num(w);
  const height = num(h);
  return width === null && height === null ? null : { width, height };
};
const splitLines = (text: string) =>
  text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean);

export function zonesToText(zones: PartType["views"][number]["zones"]): string {
  return zones.map((z) => `${z.id} | ${z.label} | ${z.polygon.map(([x, y]) => `${x},${y}`).join(" ")}`).join("\n");
}

export function textToZones(text: string) {
  return splitLines(text).map((line) => {
    const [id = "", label = "", points = ""] = line.split("|").map((p) => p.trim());
    const polygon = points
      .split(/\s+/)
      .filter(Boolean)
      .map((pair) => pair.split(",").map((v) => num(v)));
    return { id, label, polygon };
  });
}

export function optionsToText(options: Extract<ChecklistItem, { kind: "choice" }>["options"]): string {
  return options.map((o) => `${o.value} | ${o.label} | ${o.passes ? "pass" : "fail"}`).join("\n");
}

export function textToOptions(text: string) {
  return splitLines(text).map((line) => {
    const [value = "", label = "", verdict = ""] = line.split("|").map((p) => p.trim());
    return { value, label, passes: verdict.toLowerCase() === "pass" };
  });
}

function itemToInput(item: ItemForm): unknown {
  const base = { id: item.id.trim(), label: item.label, kind: item.kind, severityOnFail: item.severityOnFail, ...(item.caution.trim() ? { caution: item.caution } : {}) };
  if (item.kind === "numeric") {
    const suspectBelow = num(item.suspectBelow);
    return { ...base, unit: item.unit, min: num(item.min), max: num(item.max), decimals: num(item.decimals) ?? 0, ...(suspectBelow === null ? {} : { suspectBelow }) };
  }
  if (item.kind === "choice") return { ...base, options: textToOptions(item.options) };
  return base;
}

/** Form values → the API body (validate it with partTypeSchema). */
export function formToInput(values: PartTypeFormValues): unknown {
  return {
    name: values.name,
    category: values.category,
    modelFamily: values.modelFamily,
    inspectAll: values.inspectAll,
    promisedGrade: values.promisedGrade,
    active: values.active,
    nominalSizeMm: size(values.nominalWidth, values.nominalHeight),
    panelResolution: size(values.panelWidth, values.panelHeight),
    defectClasses: values.defectClasses.map((d) => ({ key: d.key.trim(), label: d.label, severity: d.severity })),
    checklist: values.checklist.map(itemToInput),
    views: values.views.map((v) => ({ key: v.key.trim(), label: v.label, required: v.required, ...(v.instructions.trim() ? { instructions: v.instructions } : {}), zones: textToZones(v.zones) })),
  };
}

export function partTypeToForm(
  p: Pick<PartType, "name" | "category" | "modelFamily" | "inspectAll" | "promisedGrade" | "active" | "nominalSizeMm" | "panelResolution" | "defectClasses" | "checklist" | "views">,
): PartTypeFormValues {
  const text = (v: number | undefined) => (v === undefined ? "" : String(v));
  return {
    name: p.name,
    category: p.category as PartCategory,
    modelFamily: p.modelFamily,
    inspectAll: p.inspectAll,
    promisedGrade: p.promisedGrade,
    active: p.active,
    nominalWidth: text(p.nominalSizeMm?.width),
    nominalHeight: text(p.nominalSizeMm?.height),
    panelWidth: text(p.panelResolution?.width),
    panelHeight: text(p.panelResolution?.height),
    defectClasses: p.defectClasses.map((d) => ({ ...d })),
    checklist: p.checklist.map((i) => ({
      ...EMPTY_ITEM,
      id: i.id,
      label: i.label,
      kind: i.kind,
      severityOnFail: i.severityOnFail,
      caution: i.caution ?? "",
      ...(i.kind === "numeric"
        ? {
            unit: i.unit,
            min: i.min === null ? "" : String(i.min),
            max: i.max === null ? "" : String(i.max),
            decimals: String(i.decimals),
            suspectBelow: i.suspectBelow == null ? "" : String(i.suspectBelow),
          }
        : {}),
      ...(i.kind === "choice" ? { options: optionsToText(i.options) } : {}),
    })),
    views: p.views.map((v) => ({ key: v.key, label: v.label, required: v.required, instructions: v.instructions ?? "", zones: zonesToText(v.zones) })),
  };
}
