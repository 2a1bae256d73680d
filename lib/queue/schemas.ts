import { z } from "zod";

const uuid = z.uuid({ error: "must be an id from this workspace" });

/** Filters of the queue list and of Take next ("next battery"). Unknown keys are refused. */
export const queueFiltersSchema = z
  .object({
    partTypeId: uuid.optional(),
    supplierId: uuid.optional(),
    lotId: uuid.optional(),
  })
  .strict();
export type QueueFilters = z.infer<typeof queueFiltersSchema>;

/** Units per page of the queue list when the request names no limit (the Queue screen's page). */
export const QUEUE_PAGE_SIZE = 50;

export const queueListQuerySchema = queueFiltersSchema
  .extend({
    /** The units after this row (nextCursor of the page before). */
    cursor: z.string().max(400).optional(),
    /** The units just before this row (prevCursor of the page after). */
    before: z.string().max(400).optional(),
    limit: z.coerce.number().int().min(1).max(200).default(QUEUE_PAGE_SIZE),
  })
  .strict()
  .refine((q) => q.cursor === undefined || q.before === undefined, { path: ["before"], message: "Ask for the page after a row (cursor) or before one (before), not both." });

export const reassignSchema = z.object({ userId: uuid }).strict();
