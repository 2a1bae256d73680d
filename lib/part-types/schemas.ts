/**
 * Part types: what an inspector photographs (views and their zones), which defect classes exist
 * and how serious each is, and the functional checklist. One zod schema, shared by the editor
 * form and the API; `.strict()` so unknown fields are refused.
 */
import { z } from "zod";
import type { PartType } from "@/db/schema/lots";
import { decimalPlaces } from "@/lib/checklist/evaluate";
import { EXAMPLE_PART_TYPE_SLUGS } from "@/lib/grading/example-part-types";
import { promisedGradeSchema } from "@/lib/lots/schemas";
import { DEFECT_SEVERITIES } from "./severity";

export const PART_CATEGORIES = ["camera", "battery", "housing", "display", "flex", "speaker", "other"] as const;
export type PartCategory = (typeof PART_CATEGORIES)[number];
export const CATEGORY_LABELS: Record<PartCategory, string> = {
  camera: "Camera module",
  battery: "Battery",
  housing: "Housing",
  display: "Display assembly",
  flex: "Flex cable",
  speaker: "Loudspeaker",
  other: "Other",
};
/** Categories whose parts are static-sensitive (flex cables, boards, modules with a connector). */
export const STATIC_SENSITIVE: readonly PartCategory[] = ["camera", "display", "flex"];

const key = (what: string) =>
  z
    .string({ error: `Enter a key for the ${what}.` })
    .trim()
    .min(1, `Enter a key for the ${what}.`)
    .max(40, "Keep keys under 40 characters.")
    .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, "Use lower-case letters, digits and single hyphens (e.g. lens-window).");
const label = (what: string) =>
  z
    .string({ error: `Enter a label for the ${what}.` })
    .trim()
    .min(1, `Enter a label for the ${what}.`)
    .max(80, "Keep labels under 80 characters.");
const severity = z.enum(DEFECT_SEVERITIES, { error: "Severity must be critical, major or minor." });

function uniqueBy<T>(items: T[], pick: (item: T) => string, ctx: z.RefinementCtx, what: string, field: string) {
  const seen = new Set<string>();
  items.forEach((item, index) => {
    const value = pick(item);
    if (seen.has(value)) ctx.addIssue({ code: "custom", path: [index, field], message: `The ${what} “${value}” appears twice.` });
    seen.add(value);
  });
}

const unitInterval = z.number({ error: "Zone points are numbers from 0 to 1." }).min(0, "Zone points run from 0 to 1.").max(1, "Zone points run from 0 to 1.");
export const zoneSchema = z
  .object({
    id: key("zone"),
    label: label("zone"),
    /** Polygon in 0..1 coordinates of the Surface bounding box. */
    polygon: z
      .array(z.tuple([unitInterval, unitInterval]), { error: "A zone needs a polygon." })
      .min(3, "A zone polygon needs at least 3 points.")
      .max(64, "Keep zone polygons to 64 points."),
  })
  .strict();

export const viewSchema = z
  .object({
    key: key("view"),
    label: label("view"),
    required: z.boolean({ error: "Say whether the view is required." }),
    instructions: z.string().trim().max(500, "Keep instructions under 500 characters.").optional(),
    zones: z
      .array(zoneSchema)
      .max(12, "Keep to 12 zones per view.")
      .superRefine((zones, ctx) => uniqueBy(zones, (z) => z.id, ctx, "zone", "id")),
  })
  .strict();

export const defectClassSchema = z.object({ key: key("defect class"), label: label("defect class"), severity }).strict();

const caution = z.string().trim().max(300, "Keep cautions under 300 characters.").optional();
const limit = z.number({ error: "Limits are numbers (or empty)." }).finite().nullable();

const passFailItem = z.object({ id: key("item"), label: label("item"), kind: z.literal("pass_fail"), severityOnFail: severity, caution }).strict();
const numericItem = z
  .object({
    id: key("item"),
    label: label("item"),
    kind: z.literal("numeric"),
    unit: z.string().trim().max(12, "Keep the unit under 12 characters."),
    min: limit,
    max: limit,
    decimals: z.number({ error: "Decimals is a whole number from 0 to 6." }).int("Decimals is a whole number from 0 to 6.").min(0).max(6, "Decimals is a whole number from 0 to 6."),
    /** Below this the part is set aside as suspect (e.g. an over-discharged cell), not merely failed. */
    suspectBelow: z.number({ error: "“Set aside below” is a number (or empty)." }).finite().nullable().optional(),
    severityOnFail: severity,
    caution,
  })
  .strict()
  .superRefine((item, ctx) => {
    if (item.min !== null && item.max !== null && item.min > item.max) ctx.addIssue({ code: "custom", path: ["max"], message: "The maximum must not be below the minimum." });
    if (item.suspectBelow != null && item.min !== null && item.suspectBelow > item.min) {
      ctx.addIssue({ code: "custom", path: ["suspectBelow"], message: "“Set aside below” must not be above the minimum: a reading fails first, then, lower still, is set aside." });
    }
    for (const field of ["min", "max", "suspectBelow"] as const) {
      const value = item[field];
      if (value != null && decimalPlaces(value) > item.decimals) {
        const name = field === "min" ? "The minimum" : field === "max" ? "The maximum" : "“Set aside below”";
        ctx.addIssue({ code: "custom", path: [field], message: `${name} has more decimals than the item records (${item.decimals}).` });
      }
    }
  });
const choiceItem = z
  .object({
    id: key("item"),
    label: label("item"),
    kind: z.literal("choice"),
    options: z
      .array(z.object({ value: key("choice"), label: label("choice"), passes: z.boolean() }).strict())
      .min(2, "A choice item needs at least 2 choices.")
      .max(12, "Keep to 12 choices.")
      .superRefine((options, ctx) => {
        uniqueBy(options, (o) => o.value, ctx, "choice", "value");
        if (!options.some((o) => o.passes)) ctx.addIssue({ code: "custom", message: "At least one choice must pass." });
      }),
    severityOnFail: severity,
    caution,
  })
  .strict();

export const checklistItemSchema = z.discriminatedUnion("kind", [passFailItem, numericItem, choiceItem], { error: "Item kind must be pass_fail, numeric or choice." });

/** The shapes of the part type's JSON columns (db/schema/lots.ts), read from the schemas that validate them. */
export type ZoneDefinition = z.infer<typeof zoneSchema>;
export type ViewDefinition = z.infer<typeof viewSchema>;
export type DefectClassDefinition = z.infer<typeof defectClassSchema>;
export type ChecklistItem = z.infer<typeof checklistItemSchema>;

const size = (max: number, integer: boolean) => {
  const dimension = integer ? z.number().int("Use whole pixels.").positive("Sizes are positive.").max(max) : z.number().positive("Sizes are positive.").max(max);
  return z.object({ width: dimension, height: dimension }).strict().nullable();
};

const modelFamily = z.string().trim().max(80, "Keep the model family under 80 characters.");
const nominalSizeMm = size(1000, false);
const panelResolution = size(20000, true);

// No defaults here: in zod 4 a default survives `.partial()`, which would reset fields on PATCH.
const partTypeFields = {
  name: z.string({ error: "Enter a name." }).trim().min(2, "Enter a name.").max(80, "Keep the name under 80 characters."),
  category: z.enum(PART_CATEGORIES, { error: `Category must be one of ${PART_CATEGORIES.join(", ")}.` }),
  modelFamily,
  views: z
    .array(viewSchema)
    .min(1, "A part type needs at least one view to photograph.")
    .max(12, "Keep to 12 views.")
    .superRefine((views, ctx) => uniqueBy(views, (v) => v.key, ctx, "view", "key")),
  defectClasses: z
    .array(defectClassSchema)
    .min(1, "A part type needs at least one defect class.")
    .max(40, "Keep to 40 defect classes.")
    .superRefine((classes, ctx) => uniqueBy(classes, (c) => c.key, ctx, "defect class", "key")),
  checklist: z
    .array(checklistItemSchema)
    .max(60, "Keep to 60 checklist items.")
    .superRefine((items, ctx) => uniqueBy(items, (i) => i.id, ctx, "checklist item", "id")),
  nominalSizeMm,
  panelResolution,
  inspectAll: z.boolean({ error: "inspectAll must be true or false." }),
  /** The cosmetic grade lots are bought at unless the supplier says otherwise. */
  promisedGrade: promisedGradeSchema,
  active: z.boolean({ error: "active must be true or false." }),
};

export const partTypeSchema = z
  .object({
    ...partTypeFields,
    modelFamily: modelFamily.default(""),
    nominalSizeMm: nominalSizeMm.default(null),
    panelResolution: panelResolution.default(null),
    inspectAll: partTypeFields.inspectAll.default(false),
    promisedGrade: partTypeFields.promisedGrade.default("A"),
    active: partTypeFields.active.default(true),
  })
  .strict();
export type PartTypeInput = z.infer<typeof partTypeSchema>;

export const partTypeUpdateSchema = z
  .object(partTypeFields)
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, "Nothing to change.");
export type PartTypeUpdateInput = z.infer<typeof partTypeUpdateSchema>;

/** Which starter part types to add (lib/part-types/starters.ts). */
export const starterRequestSchema = z.strictObject({
  slugs: z
    .array(z.enum(EXAMPLE_PART_TYPE_SLUGS, { error: `Starter part types are ${EXAMPLE_PART_TYPE_SLUGS.join(", ")}.` }), { error: "slugs is a list of starter part types." })
    .min(1, "Choose at least one starter part type.")
    .max(EXAMPLE_PART_TYPE_SLUGS.length),
});

export const partTypeListQuerySchema = z.object({ active: z.enum(["true", "false", "all"]).optional() }).strict();

/** The lists a rubric is checked against (lib/grading/rubric-schema.ts `PartTypeLists`). */
export function partTypeLists(partType: Pick<PartType, "views" | "defectClasses">) {
  const zones = new Set(partType.views.flatMap((v) => v.zones.map((z) => z.id)));
  return { defects: partType.defectClasses.map((d) => d.key), zones: [...zones], views: partType.views.map((v) => v.key) };
}

export function isBatteryPart(partType: { category: string }): boolean {
  return partType.category === "battery";
}
