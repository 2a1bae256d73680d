/** Unit input: creating a lot's sample, editing a placeholder's serial, moving a unit, checklist results. */
import { z } from "zod";
import { MAX_SERIAL_LENGTH, serialProblem } from "./serial-csv";

/** Upper bound of a serial list body (20 000 lines of up to 64 characters fit well inside). */
export const MAX_SERIAL_LIST_BYTES = 2 * 1024 * 1024;

export const serialSchema = z
  .string({ error: "Enter the serial." })
  .trim()
  .min(1, "Enter the serial.")
  .max(MAX_SERIAL_LENGTH, `A serial has at most ${MAX_SERIAL_LENGTH} characters.`)
  .superRefine((serial, ctx) => {
    const problem = serialProblem(serial);
    if (problem) ctx.addIssue({ code: "custom", message: `The serial is not valid: ${problem}.` });
  });

export const unitsCreateSchema = z.discriminatedUnion(
  "source",
  [
    z
      .object({
        source: z.literal("serials"),
        csv: z.string({ error: "Paste or upload the list of serials." }).min(1, "Paste or upload the list of serials."),
        /** Optional: repeat a recorded draw. Normally the server picks a fresh random seed. */
        seed: z
          .string()
          .regex(/^\d{1,10}$/, "A draw seed is a whole number from 0 to 4294967295.")
          .refine((s) => Number(s) <= 0xffffffff, "A draw seed is a whole number from 0 to 4294967295.")
          .optional(),
      })
      .strict(),
    z.object({ source: z.literal("placeholders") }).strict(),
  ],
  { error: 'Say where the units come from: source "serials" (with csv) or "placeholders".' },
);
export type UnitsCreateInput = z.infer<typeof unitsCreateSchema>;

export const unitUpdateSchema = z.object({ serial: serialSchema }).strict();

export const UNIT_BENCH_EVENTS = ["claim", "release"] as const;
export const unitStatusSchema = z.object({ event: z.enum(UNIT_BENCH_EVENTS, { error: "event must be claim or release." }) }).strict();

export const checklistValueSchema = z.union([z.object({ pass: z.boolean() }).strict(), z.object({ reading: z.number().finite() }).strict(), z.object({ choice: z.string().min(1).max(40) }).strict()], {
  error: "value is { pass: true|false }, { reading: number } or { choice: string }.",
});
/** One recorded checklist value (also the type of checklist_results.value). */
export type ChecklistValue = z.infer<typeof checklistValueSchema>;
export const checklistRecordSchema = z
  .object({
    itemId: z.string({ error: "Say which checklist item this is." }).min(1, "Say which checklist item this is.").max(40),
    value: checklistValueSchema,
    note: z.string().trim().max(500, "Keep the note under 500 characters.").optional(),
  })
  .strict();
export type ChecklistRecordInput = z.infer<typeof checklistRecordSchema>;
