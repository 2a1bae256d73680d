/** Request bodies of the Recheck API, shared by forms and handlers. */
import { z } from "zod";
import { isUuid } from "@/lib/validation";

const uuid = (what: string) => z.string({ error: `${what} is required.` }).refine(isUuid, `${what} is not a valid id.`).transform((value) => value.toLowerCase());

/** A lead or an auditor sends a unit's current grade to recheck. */
export const sendToRecheckSchema = z.strictObject({
  unitId: uuid("The unit"),
  note: z.string().trim().max(500, "Keep the note under 500 characters.").optional(),
});
export type SendToRecheckInput = z.infer<typeof sendToRecheckSchema>;
