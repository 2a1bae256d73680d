import "server-only";
import { getPartType } from "@/db/queries/part-types";
import { getSupplier } from "@/db/queries/suppliers";
import { notFound } from "@/lib/errors";
import type { ReportFilter } from "./filters";

/**
 * A filter naming a supplier or part type must name one of this workspace: another workspace's id
 * answers 404 as a missing one does, rather than an empty export that looks like "no data".
 */
export async function checkReportFilter(workspaceId: string, filter: ReportFilter): Promise<void> {
  const [supplier, partType] = await Promise.all([
    filter.supplierId ? getSupplier({ workspaceId, supplierId: filter.supplierId }) : null,
    filter.partTypeId ? getPartType({ workspaceId, partTypeId: filter.partTypeId }) : null,
  ]);
  if (filter.supplierId && !supplier) throw notFound("That supplier");
  if (filter.partTypeId && !partType) throw notFound("That part type");
}
