/**
 * TanStack Query keys of the Lots feature. Every key starts with `lotKeys.all`, so
 * `invalidateQueries({ queryKey: lotKeys.all })` refreshes all of them and `lotKeys.lists()`
 * every page of the list, whatever its filters.
 */
import type { LotListQuery } from "@/lib/lots/schemas";

export const lotKeys = {
  all: ["lots"] as const,
  lists: () => [...lotKeys.all, "list"] as const,
  /** One page of the list: the parsed URL state is the key (TanStack hashes it with sorted keys). */
  list: (query: LotListQuery) => [...lotKeys.lists(), query] as const,
  /** The switching state (normal / tightened / reduced) the next lot of a supplier and part type gets. */
  switching: (supplierId: string, partTypeId: string) => [...lotKeys.all, "switching", supplierId, partTypeId] as const,
};
