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

export const queueListQuerySchema = queueFiltersSchema
  .extend({
    cursor: z.string().max(400).optional(),
    limit: z.coerce.number().int().min(1).max(200).default(50),
  })
  .strict();

export const reassignSchema = z.object({ userId: uuid }).strict();
