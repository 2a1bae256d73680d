import { dehydrate, HydrationBoundary, QueryClient, type QueryKey } from "@tanstack/react-query";

/**
 * Hands data a server component already loaded to the client's TanStack queries under their
 * keys (from `lib/query-keys`), so a list's first page arrives with the HTML and its query starts
 * from it instead of fetching the same rows again. The data must be the JSON the query's API
 * route sends (plain strings and numbers, no Dates), so the cache holds one shape.
 */
export function Prefetched({ entries, children }: { entries: { queryKey: QueryKey; data: unknown }[]; children: React.ReactNode }) {
  const client = new QueryClient();
  for (const { queryKey, data } of entries) client.setQueryData(queryKey, data);
  return <HydrationBoundary state={dehydrate(client)}>{children}</HydrationBoundary>;
}
