/**
 * The Reports screen's filters, in its URL (`/reports?supplierId=…&from=2026-09-01&period=week`)
 * and in the CSV export links, read with one schema by the page and the export route. Pure.
 *
 * What the dates mean (decision): `from`/`to` are local calendar days, both included. Lot-based
 * figures (the lot list, supplier scorecards, the lots/units/defects exports) take lots *received*
 * in that range — a lot belongs to the day it came in, as in supplier-scorecard.ts. Grade-based
 * figures (grade distribution, throughput, the grades export) take units *graded* in that range,
 * by the workspace's time zone. With no dates, everything.
 */
import { z } from "zod";
import { isoDate } from "@/lib/lots/schemas";
import type { AllowedValues } from "@/lib/url-state/list-params";

export const EXPORT_KINDS = ["lots", "units", "grades", "defects"] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

export const EXPORT_LABELS: Record<ExportKind, string> = {
  lots: "Lots (one row per lot)",
  units: "Units (one row per sampled unit, with its current grade)",
  grades: "Grades (every grade of the history)",
  defects: "Defects (one row per marked region, with its measurements)",
};

export const REPORT_PERIODS = ["week", "month"] as const;

const filterFields = {
  supplierId: z.uuid({ error: "Choose a supplier from the list." }).optional(),
  partTypeId: z.uuid({ error: "Choose a part type from the list." }).optional(),
  from: isoDate("first day").optional(),
  to: isoDate("last day").optional(),
};

const fromBeforeTo = (value: { from?: string; to?: string }) => !value.from || !value.to || value.from <= value.to;
const FROM_TO_MESSAGE = { error: "The first day must be on or before the last day.", path: ["to"] };

/** Filters of the exports (the API's query string). */
export const reportFilterSchema = z.object(filterFields).strict().refine(fromBeforeTo, FROM_TO_MESSAGE);
export type ReportFilter = z.infer<typeof reportFilterSchema>;

/** The export route's query string: which export, and the filters. */
export const exportQuerySchema = z
  .object({ kind: z.enum(EXPORT_KINDS, { error: `Choose an export: ${EXPORT_KINDS.join(", ")}.` }), ...filterFields })
  .strict()
  .refine(fromBeforeTo, FROM_TO_MESSAGE);

/** The screen's URL state: the filters, the grade distribution's period and the lot list's page. */
export const reportParamsSchema = z
  .object({
    ...filterFields,
    period: z.enum(REPORT_PERIODS).default("month"),
    page: z.coerce.number().int().min(1).max(10_000).default(1),
  })
  .strict()
  .refine(fromBeforeTo, FROM_TO_MESSAGE);
export type ReportParams = z.infer<typeof reportParamsSchema>;

export const REPORT_PAGE_KEYS = ["page"] as const satisfies readonly (keyof ReportParams)[];
export const REPORT_LOTS_PAGE_SIZE = 25;

/** A link's supplier or part type must be one the filter offers (this workspace's). */
export function reportAllowed(options: { suppliers: readonly { id: string }[]; partTypes: readonly { id: string }[] }): AllowedValues<ReportParams> {
  return { supplierId: options.suppliers.map((s) => s.id), partTypeId: options.partTypes.map((p) => p.id) };
}

export const REPORT_PARAM_LABELS: Record<keyof ReportParams, string> = {
  supplierId: "supplier",
  partTypeId: "part type",
  from: "first day",
  to: "last day",
  period: "period",
  page: "page",
};

/** The export's link for the screen's filters (only the filter keys, no defaults). */
export function exportHref(kind: ExportKind, filter: ReportFilter): string {
  const params = new URLSearchParams({ kind });
  for (const key of ["supplierId", "partTypeId", "from", "to"] as const) if (filter[key]) params.set(key, filter[key]);
  return `/api/reports/export?${params}`;
}
