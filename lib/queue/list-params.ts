/**
 * The Queue list's state in the URL (`/queue?partTypeId=…&cursor=…&page=2`): the Take next
 * filters plus the keyset page. A cursor is the sort key of the row next to the page (see
 * cursor.ts), so a shared page-2 link starts at the same unit even after units ahead were taken;
 * `page` only numbers the page for the reader and comes with a cursor. Pure; shared by the server
 * page and the client components.
 */
import { z } from "zod";
import type { AllowedValues } from "@/lib/url-state/list-params";
import { readCursor } from "./cursor";
import { queueFiltersSchema } from "./schemas";

const cursorParam = z
  .string()
  .max(400)
  .refine((value) => readCursor(value) !== null, "not a page of this queue")
  .optional();

export const queueListParamsSchema = queueFiltersSchema
  .extend({
    cursor: cursorParam,
    before: cursorParam,
    page: z.coerce.number().int().min(2).max(100_000).optional(),
  })
  .strict()
  .superRefine((q, ctx) => {
    if (q.cursor !== undefined && q.before !== undefined) ctx.addIssue({ code: "custom", path: ["before"], message: "a page is after a row or before one, not both" });
    const hasCursor = q.cursor !== undefined || q.before !== undefined;
    if (hasCursor && q.page === undefined) ctx.addIssue({ code: "custom", path: [q.cursor !== undefined ? "cursor" : "before"], message: "a later page comes with its number" });
    if (!hasCursor && q.page !== undefined) ctx.addIssue({ code: "custom", path: ["page"], message: "a later page comes with its cursor" });
  });
export type QueueListParams = z.infer<typeof queueListParamsSchema>;

/** Reset to the first page whenever a filter changes. */
export const QUEUE_LIST_PAGE_KEYS = ["cursor", "before", "page"] as const satisfies readonly (keyof QueueListParams)[];

export type QueueFilterOptions = {
  partTypes: { id: string; name: string }[];
  suppliers: { id: string; name: string }[];
  lots: { id: string; label: string }[];
};

/** A link's part type, supplier and lot must be ones the filters offer (this workspace's; open lots only). */
export function queueListAllowed(options: QueueFilterOptions): AllowedValues<QueueListParams> {
  return { partTypeId: options.partTypes.map((p) => p.id), supplierId: options.suppliers.map((s) => s.id), lotId: options.lots.map((l) => l.id) };
}

/** The query string GET /api/queue takes for these params (the page number stays in the URL only). */
export function queueApiSearch({ page: _page, ...rest }: QueueListParams): string {
  const out = new URLSearchParams(Object.entries(rest).filter((e): e is [string, string] => typeof e[1] === "string" && e[1] !== ""));
  const text = out.toString();
  return text ? `?${text}` : "";
}

export const QUEUE_LIST_LABELS: Record<keyof QueueListParams, string> = {
  partTypeId: "part type",
  supplierId: "supplier",
  lotId: "lot (closed, or not in this workspace)",
  cursor: "page",
  before: "page",
  page: "page",
};
