/** Workspace settings input, shared by the settings form and the API. */
import { z } from "zod";
import { isValidTimeZone } from "@/lib/time/format";

export const workspaceSettingsSchema = z.strictObject({
  timeZone: z
    .string({ error: "Choose the time zone every time is shown in." })
    .trim()
    .min(1, "Choose the time zone every time is shown in.")
    .max(64, "Choose a time zone from the list.")
    .refine(isValidTimeZone, "Choose a time zone from the list (an IANA name such as Europe/Berlin)."),
});
export type WorkspaceSettingsInput = z.infer<typeof workspaceSettingsSchema>;
