import "server-only";
import { transaction } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { logActivity } from "@/db/queries/activity";
import { insertPartType, updatePartTypeFields } from "@/db/queries/part-types";
import { slugify } from "@/lib/accounts/slugify";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import type { PartTypeInput, PartTypeUpdateInput } from "./schemas";

const duplicate = () => new AppError("conflict", "A part type with this name already exists in your workspace.", { fieldErrors: { name: "A part type with this name already exists." } });

export function partTypeSlug(name: string): string {
  const slug = slugify(name);
  return slug === "workspace" ? "part-type" : slug;
}

export async function createPartType(actor: SessionUser, input: PartTypeInput) {
  try {
    return await transaction(async (tx) => {
      const row = await insertPartType(tx, { ...input, workspaceId: actor.workspaceId, slug: partTypeSlug(input.name) });
      await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "part_type.created", subjectType: "part_type", subjectId: row.id, detail: { name: row.name } });
      return row;
    });
  } catch (err) {
    if (isUniqueViolation(err, "part_types_workspace_slug_key") || isUniqueViolation(err, "part_types_workspace_name_key")) throw duplicate();
    throw err;
  }
}

/**
 * Edits a part type. The slug stays as created (rubrics and seeds refer to it). Lots keep the plan
 * they were created with; checklist results keep the severity they were recorded with.
 */
export async function updatePartType(actor: SessionUser, partTypeId: string, input: PartTypeUpdateInput) {
  try {
    return await transaction(async (tx) => {
      const row = await updatePartTypeFields(tx, { workspaceId: actor.workspaceId, partTypeId, fields: input });
      if (!row) throw notFound("That part type");
      await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "part_type.updated", subjectType: "part_type", subjectId: row.id, detail: { fields: Object.keys(input) } });
      return row;
    });
  } catch (err) {
    if (isUniqueViolation(err, "part_types_workspace_slug_key") || isUniqueViolation(err, "part_types_workspace_name_key")) throw duplicate();
    throw err;
  }
}
