/** Request bodies of the photo API (zod, `.strict()` so unknown fields are refused). */
import { z } from "zod";

export const uploadIntentSchema = z
  .object({
    viewKey: z.string({ error: "Choose the view this photo shows." }).trim().min(1, "Choose the view this photo shows.").max(64),
    // Display only; never part of an object key.
    fileName: z
      .string({ error: "The file has no name." })
      .trim()
      .max(500)
      .transform((name) => name.replace(/[\u0000-\u001f\u007f]/g, "").slice(-200) || "photo"),
    /** What the browser says the file is; only a hint (the first bytes decide later). */
    contentType: z.string().trim().max(200).default(""),
    bytes: z.number({ error: "Send the file size in bytes." }).int("The file size must be a whole number of bytes.").min(0).max(Number.MAX_SAFE_INTEGER),
  })
  .strict();
export type UploadIntentInput = z.infer<typeof uploadIntentSchema>;

export const finaliseSchema = z.object({ ticket: z.string({ error: "Send the upload ticket you were given." }).min(1, "Send the upload ticket you were given.").max(4000) }).strict();
export type FinaliseInput = z.infer<typeof finaliseSchema>;

/** `?wait=0` answers at once (202) instead of waiting for the worker's verdict. */
export const finaliseQuerySchema = z.object({ wait: z.enum(["0", "1"]).optional() }).strict();

export const photoViewSchema = z.object({ viewKey: z.string({ error: "Choose the view this photo shows." }).trim().min(1, "Choose the view this photo shows.").max(64) }).strict();

export const photoRemovalSchema = z
  .object({
    reason: z
      .string({ error: "Say why the photo is removed." })
      .trim()
      .min(3, "Say why the photo is removed (a few words are enough, e.g. “another unit's back”).")
      .max(500, "Keep the reason under 500 characters."),
  })
  .strict();
