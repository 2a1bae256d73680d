/**
 * TanStack Query keys of the Queue feature. Every key starts with `queueKeys.all`: after Take
 * next or a lease change, invalidating it refreshes the list and the depth figures together.
 */
import type { QueueListParams } from "@/lib/queue/list-params";

export const queueKeys = {
  all: ["queue"] as const,
  lists: () => [...queueKeys.all, "list"] as const,
  /** One page of the list: the parsed URL state (filters and cursor) is the key. */
  list: (params: QueueListParams) => [...queueKeys.lists(), params] as const,
  stats: () => [...queueKeys.all, "stats"] as const,
};
