/** The Reports filters (lib/reports/filters.ts): what a link or an export query may carry. */
import { describe, expect, it } from "vitest";
import { exportHref, exportQuerySchema, reportParamsSchema } from "@/lib/reports/filters";
import { readListParams } from "@/lib/url-state/list-params";

const SUPPLIER = "5b0c3c8e-8d0e-4a61-9f43-2a7c5d1e9b10";

describe("report filters", () => {
  it("an export names its kind; an unknown kind or backwards days are refused with a sentence", () => {
    expect(exportQuerySchema.parse({ kind: "defects", from: "2026-10-01", to: "2026-10-31" })).toEqual({ kind: "defects", from: "2026-10-01", to: "2026-10-31" });
    const unknown = exportQuerySchema.safeParse({ kind: "invoices" });
    expect(unknown.success).toBe(false);
    expect(unknown.error?.issues[0].message).toBe("Choose an export: lots, units, grades, defects.");
    const backwards = exportQuerySchema.safeParse({ kind: "lots", from: "2026-11-02", to: "2026-11-01" });
    expect(backwards.error?.issues[0]).toMatchObject({ path: ["to"], message: "The first day must be on or before the last day." });
    expect(exportQuerySchema.safeParse({ kind: "lots", from: "2026-02-29" }).success).toBe(false); // 2026 is not a leap year
    expect(exportQuerySchema.safeParse({ kind: "lots", extra: "1" }).success).toBe(false);
  });

  it("the screen's link: bad values fall back to defaults and are named; the export link keeps only the filter", () => {
    const { params, ignored } = readListParams(reportParamsSchema, new URLSearchParams(`supplierId=${SUPPLIER}&period=fortnight&page=3`), { allowed: { supplierId: [SUPPLIER] }, pageKeys: ["page"] });
    expect(params).toMatchObject({ supplierId: SUPPLIER, period: "month", page: 1 });
    expect(ignored.sort()).toEqual(["page", "period"]);
    expect(exportHref("units", { supplierId: SUPPLIER, from: "2026-10-01" })).toBe(`/api/reports/export?kind=units&supplierId=${SUPPLIER}&from=2026-10-01`);
  });
});
