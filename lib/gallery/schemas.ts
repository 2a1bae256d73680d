/**
 * Request shapes of the Gallery API (zod, strict: unknown fields are refused). The region set of
 * an edit is checked later against the item's photo and part type (lib/geometry/validate.ts plus
 * the gallery's own budget), as the Bench's save is.
 */
import { z } from "zod";
import { GRADES } from "@/lib/grading/rubric-schema";
import { uploadIntentSchema } from "@/lib/photos/schemas";
import { CAPTION_MAX, GALLERY_KINDS, GALLERY_STATUSES } from "./rules";

const uuid = (what: string) => z.uuid({ error: `must be the id of ${what} in this workspace` });
const revision = z.number({ error: "must be the revision number the edit started from" }).int("must be a whole number").min(0, "cannot be negative");
const kind = z.enum(GALLERY_KINDS, { error: 'must be "normal" or "abnormal"' });
const grade = z.enum(GRADES, { error: "must be one of A, B, C, Reject" });
const caption = z
  .string({ error: "must be text" })
  .transform((text) => text.replace(/[\u0000-\u0008\u000b-\u001f\u007f]/g, "").trim())
  .pipe(z.string().max(CAPTION_MAX, `may be at most ${CAPTION_MAX} characters`));

/** Promote a graded unit's photo: its regions and the unit's grade become a draft. */
export const promoteSchema = z.strictObject({ photoId: uuid("a unit's photo") });
export type PromoteInput = z.infer<typeof promoteSchema>;

/** An edit names the revision it started from; every other field is optional (at least one). */
export const editItemSchema = z
  .strictObject({
    revision,
    caption: caption.optional(),
    grade: grade.optional(),
    kind: kind.optional(),
    regions: z.unknown().optional(),
  })
  .refine((edit) => edit.caption !== undefined || edit.grade !== undefined || edit.kind !== undefined || edit.regions !== undefined, "Send at least one of caption, grade, kind or regions.");
export type EditItemInput = z.infer<typeof editItemSchema>;

export const transitionSchema = z.strictObject({ revision });
export type TransitionInput = z.infer<typeof transitionSchema>;

/** Gallery items are small curated sets: a page of 48 fills a grid of 4, 6 or 8 columns. */
export const GALLERY_PAGE_DEFAULT = 48;

/** List filters as they come from the URL (`?partType=…&view=…&defect=…&kind=…&grade=…&status=…&cursor=…`). */
export const galleryListQuerySchema = z.strictObject({
  partType: uuid("a part type").optional(),
  view: z.string().trim().min(1).max(64).optional(),
  defect: z.string().trim().min(1).max(64).optional(),
  kind: kind.optional(),
  grade: grade.optional(),
  /** Editors only; others always see published items. "all": draft and published (not retired). */
  status: z.enum([...GALLERY_STATUSES, "all"], { error: 'must be "draft", "published", "retired" or "all"' }).optional(),
  cursor: z.string().max(400).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(GALLERY_PAGE_DEFAULT),
});
export type GalleryListQuery = z.infer<typeof galleryListQuerySchema>;

export const referenceQuerySchema = z.strictObject({
  partType: uuid("a part type"),
  view: z.string().trim().min(1).max(64),
  defect: z.string().trim().min(1).max(64).optional(),
});
export type ReferenceQuery = z.infer<typeof referenceQuerySchema>;

/** Upload straight into the Gallery: what the photo shows and the grade it deserves, plus the file. */
export const galleryUploadIntentSchema = uploadIntentSchema.extend({
  partTypeId: uuid("a part type"),
  kind,
  grade,
});
export type GalleryUploadIntentInput = z.infer<typeof galleryUploadIntentSchema>;
