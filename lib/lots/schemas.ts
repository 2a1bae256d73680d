/** Lot input: shared by the create form, the disposition form and the API handlers. */
import { z } from "zod";
import { INSPECTION_LEVELS, PREFERRED_AQLS } from "@/lib/sampling/iso2859";

/**
 * Largest lot accepted. Table 1's last row is open-ended ("500 001 and over"); a delivery larger than
 * its last bounded row is split into lots, which ISO 2859-1 wants homogeneous anyway. Our choice (c).
 */
export const MAX_LOT_SIZE = 500_000;
/** A lot inspected 100 % makes one unit row per part; beyond this, split the delivery. */
export const MAX_UNITS_PER_LOT = 10_000;

export const DISPOSITIONS = ["to_stock", "downgrade", "sort", "return_to_vendor"] as const;
export type Disposition = (typeof DISPOSITIONS)[number];
export const DISPOSITION_LABELS: Record<Disposition, string> = {
  to_stock: "To stock",
  downgrade: "Downgrade",
  sort: "Sort 100 %",
  return_to_vendor: "Return to vendor",
};
/** What a lead may do with a lot of each verdict (a rejected lot never goes to stock as it is). */
export const DISPOSITIONS_FOR_VERDICT: Record<"accept" | "reject", readonly Disposition[]> = {
  accept: ["to_stock", "downgrade"],
  reject: ["downgrade", "sort", "return_to_vendor"],
};

/** Cosmetic grades a purchase can promise (Reject is never bought). */
export const PROMISED_GRADES = ["A", "B", "C"] as const;
export type PromisedGrade = (typeof PROMISED_GRADES)[number];
export const promisedGradeSchema = z.enum(PROMISED_GRADES, { error: "The promised grade is A, B or C." });

const uuid = (what: string) => z.string({ error: `Choose a ${what}.` }).uuid(`Choose a ${what}.`);

/** A calendar date as YYYY-MM-DD that really exists (2026-02-30 does not). */
export const isoDate = (what: string) =>
  z
    .string({ error: `Enter the ${what} as YYYY-MM-DD.` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `Enter the ${what} as YYYY-MM-DD.`)
    .refine((value) => {
      const [y, m, d] = value.split("-").map(Number);
      const date = new Date(Date.UTC(y, m - 1, d));
      return y >= 2000 && y <= 2100 && date.getUTCFullYear() === y && date.getUTCMonth() === m - 1 && date.getUTCDate() === d;
    }, `The ${what} is not a real calendar date between 2000 and 2100.`);

const aqlMessage = `Choose an AQL from the standard's preferred values (${PREFERRED_AQLS.join(", ")}).`;
export const aqlSchema = z.number({ error: aqlMessage }).refine((v) => (PREFERRED_AQLS as readonly number[]).includes(v), aqlMessage);

export const lotCreateSchema = z
  .object({
    supplierId: uuid("supplier"),
    partTypeId: uuid("part type"),
    purchaseRef: z.string({ error: "Enter the purchase reference." }).trim().min(1, "Enter the purchase reference.").max(60, "Keep the purchase reference under 60 characters."),
    modelFamily: z.string().trim().max(80, "Keep the model family under 80 characters.").default(""),
    quantity: z
      .number({ error: "Enter the quantity received as a whole number." })
      .int("Enter the quantity received as a whole number.")
      .min(1, "The quantity received must be at least 1.")
      .max(MAX_LOT_SIZE, `Lots of more than ${MAX_LOT_SIZE.toLocaleString("en-GB")} units are beyond what we support: split the delivery into lots.`),
    receivedOn: isoDate("received date"),
    dueOn: isoDate("due date"),
    inspectionLevel: z.enum(INSPECTION_LEVELS, { error: `Choose an inspection level (${INSPECTION_LEVELS.join(", ")}).` }),
    /** null = no AQL for critical defects: any critical defect rejects the lot. */
    aqlCritical: aqlSchema.nullable(),
    aqlMajor: aqlSchema,
    aqlMinor: aqlSchema,
    /** Left out: the supplier's default, else the part type's. */
    promisedGrade: promisedGradeSchema.optional(),
  })
  .strict()
  .refine((lot) => lot.dueOn >= lot.receivedOn, { path: ["dueOn"], message: "The due date cannot be before the received date." });
export type LotCreateInput = z.infer<typeof lotCreateSchema>;

export const LOT_SORTS = ["dueOn", "receivedOn", "createdAt", "purchaseRef", "supplier", "partType", "quantity", "status"] as const;
export type LotSort = (typeof LOT_SORTS)[number];
export const LOT_PAGE_SIZES = [10, 20, 50] as const;

export const lotListQuerySchema = z
  .object({
    page: z.coerce.number().int().min(1, "page starts at 1").max(100_000).default(1),
    pageSize: z.coerce
      .number()
      .refine((v) => (LOT_PAGE_SIZES as readonly number[]).includes(v), `pageSize is one of ${LOT_PAGE_SIZES.join(", ")}`)
      .default(20),
    sort: z.enum(LOT_SORTS).default("dueOn"),
    dir: z.enum(["asc", "desc"]).default("asc"),
    status: z.enum(["open", "decided", "all"]).default("all"),
    supplierId: z.string().uuid("supplierId must be an id").optional(),
    partTypeId: z.string().uuid("partTypeId must be an id").optional(),
    search: z.string().trim().max(60).optional(),
  })
  .strict();
export type LotListQuery = z.infer<typeof lotListQuerySchema>;

export const dispositionSchema = z
  .object({
    disposition: z.enum(DISPOSITIONS, { error: "Choose a disposition: to stock, downgrade, sort or return to vendor." }),
    reason: z.string({ error: "Give a reason for the disposition." }).trim().min(3, "Give a reason for the disposition.").max(1000, "Keep the reason under 1 000 characters."),
  })
  .strict();
export type DispositionInput = z.infer<typeof dispositionSchema>;

export const schemeQuerySchema = z.object({ supplierId: uuid("supplier"), partTypeId: uuid("part type") }).strict();

export const schemeUpdateSchema = z
  .object({
    supplierId: uuid("supplier"),
    partTypeId: uuid("part type"),
    reducedAllowed: z.boolean({ error: "reducedAllowed must be true or false." }).optional(),
    steadyProduction: z.boolean({ error: "steadyProduction must be true or false." }).optional(),
    /** The supplier corrected the cause: resume a discontinued inspection (on tightened). */
    recordCorrectiveAction: z.literal(true, { error: "recordCorrectiveAction can only be true." }).optional(),
  })
  .strict()
  .refine((v) => v.reducedAllowed !== undefined || v.steadyProduction !== undefined || v.recordCorrectiveAction, "Nothing to change.");
export type SchemeUpdateInput = z.infer<typeof schemeUpdateSchema>;
