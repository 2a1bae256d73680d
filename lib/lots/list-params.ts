/**
 * The Lots list's state in the URL (`/lots?status=open&supplierId=…&page=2`): the API's own query
 * schema, so the page, the browser and GET /api/lots read a link alike. Pure; shared by the server
 * page and the client components.
 */
import type { AllowedValues } from "@/lib/url-state/list-params";
import type { LotListQuery } from "./schemas";

export { lotListQuerySchema as lotListParamsSchema } from "./schemas";

/** Reset to the first page whenever a filter changes. */
export const LOT_LIST_PAGE_KEYS = ["page"] as const satisfies readonly (keyof LotListQuery)[];

/** A link's supplier or part type must be one the filter offers (this workspace's). */
export function lotListAllowed(options: { suppliers: readonly { id: string }[]; partTypes: readonly { id: string }[] }): AllowedValues<LotListQuery> {
  return { supplierId: options.suppliers.map((s) => s.id), partTypeId: options.partTypes.map((p) => p.id) };
}

/** How the screen names each key when a link's value is left out. */
export const LOT_LIST_LABELS: Record<keyof LotListQuery, string> = {
  page: "page",
  pageSize: "lots per page",
  sort: "sort",
  dir: "sort direction",
  status: "status",
  supplierId: "supplier",
  partTypeId: "part type",
  search: "purchase ref",
};
