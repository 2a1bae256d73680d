import { foreignKey, type AnyPgColumn } from "drizzle-orm/pg-core";

/**
 * A foreign key on (workspace_id, column) → parent (workspace_id, id): a row can only name a
 * parent of its own workspace, so a forged id of another company fails in the database too, not
 * only in the query's WHERE clause. The parent declares `unique(<table>_workspace_id_key)`.
 * A null column is not checked (MATCH SIMPLE), as with a plain foreign key.
 */
export function sameWorkspace(name: string, workspaceId: AnyPgColumn, column: AnyPgColumn, parent: { workspaceId: AnyPgColumn; id: AnyPgColumn }) {
  return foreignKey({ name, columns: [workspaceId, column], foreignColumns: [parent.workspaceId, parent.id] });
}
