import "server-only";
import { transaction } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { logActivity } from "@/db/queries/activity";
import { insertSupplier, updateSupplierFields } from "@/db/queries/suppliers";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import type { SupplierInput, SupplierUpdateInput } from "./schemas";

const duplicate = () => new AppError("conflict", "A supplier with this name already exists in your workspace.", { fieldErrors: { name: "A supplier with this name already exists." } });

export async function createSupplier(actor: SessionUser, input: SupplierInput) {
  try {
    return await transaction(async (tx) => {
      const row = await insertSupplier(tx, { ...input, workspaceId: actor.workspaceId });
      await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "supplier.created", subjectType: "supplier", subjectId: row.id, detail: { name: row.name } });
      return row;
    });
  } catch (err) {
    if (isUniqueViolation(err, "suppliers_workspace_name_key")) throw duplicate();
    throw err;
  }
}

export async function updateSupplier(actor: SessionUser, supplierId: string, input: SupplierUpdateInput) {
  try {
    return await transaction(async (tx) => {
      const row = await updateSupplierFields(tx, { workspaceId: actor.workspaceId, supplierId, fields: input });
      if (!row) throw notFound("That supplier");
      await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "supplier.updated", subjectType: "supplier", subjectId: row.id, detail: { ...input } });
      return row;
    });
  } catch (err) {
    if (isUniqueViolation(err, "suppliers_workspace_name_key")) throw duplicate();
    throw err;
  }
}
