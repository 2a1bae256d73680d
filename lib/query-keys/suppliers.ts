/** TanStack Query keys of the Suppliers feature; every key starts with `supplierKeys.all`. */
import type { SupplierListParams } from "@/lib/suppliers/schemas";

export const supplierKeys = {
  all: ["suppliers"] as const,
  lists: () => [...supplierKeys.all, "list"] as const,
  list: (params: SupplierListParams) => [...supplierKeys.lists(), params] as const,
};
