import Form from "next/form";
import Link from "next/link";
import { IgnoredParamsNote } from "@/components/ui/ignored-params-note";
import { REPORT_PARAM_LABELS, type ReportParams } from "@/lib/reports/filters";

export type ReportFilterOptions = { suppliers: { id: string; name: string }[]; partTypes: { id: string; name: string }[] };

/**
 * The Reports filters as a GET form: applying it navigates to `/reports?…`, so the filter lives in
 * the URL (a shared link and the back button show the same figures) and the server renders the
 * figures for it. Works before the page has hydrated, too.
 */
export function ReportFilters({ params, ignored, options }: { params: ReportParams; ignored: string[]; options: ReportFilterOptions }) {
  return (
    <div className="space-y-3">
      <IgnoredParamsNote ignored={ignored} labels={REPORT_PARAM_LABELS} />
      <Form action="/reports" className="card grid items-end gap-3 p-4 sm:grid-cols-2 lg:grid-cols-3 xl:grid-cols-6" role="search" aria-label="Filter reports">
        <label className="block xl:col-span-2">
          <span className="field-label">Supplier</span>
          <select name="supplierId" className="field-input" defaultValue={params.supplierId ?? ""}>
            <option value="">All suppliers</option>
            {options.suppliers.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Part type</span>
          <select name="partTypeId" className="field-input" defaultValue={params.partTypeId ?? ""}>
            <option value="">All part types</option>
            {options.partTypes.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">From</span>
          <input type="date" name="from" className="field-input" defaultValue={params.from ?? ""} />
        </label>
        <label className="block">
          <span className="field-label">To</span>
          <input type="date" name="to" className="field-input" defaultValue={params.to ?? ""} />
        </label>
        <label className="block">
          <span className="field-label">Grades per</span>
          <select name="period" className="field-input" defaultValue={params.period}>
            <option value="month">Month</option>
            <option value="week">Week</option>
          </select>
        </label>
        <p className="text-xs text-gauge-600 sm:col-span-2 xl:col-span-4">Lots count by the day they were received; grades and throughput by the day units were graded.</p>
        <div className="flex gap-2 sm:justify-end lg:col-span-1 xl:col-span-2">
          <Link href="/reports" className="btn-secondary">
            Clear
          </Link>
          <button type="submit" className="btn-primary">
            Apply filters
          </button>
        </div>
      </Form>
    </div>
  );
}
