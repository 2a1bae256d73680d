"use client";

export type Filters = { partTypeId?: string; supplierId?: string; lotId?: string };
export type FilterOptions = {
  partTypes: { id: string; name: string }[];
  suppliers: { id: string; name: string }[];
  lots: { id: string; label: string }[];
};

const FIELDS = [
  { key: "partTypeId", label: "Part type", all: "All part types", source: "partTypes" },
  { key: "supplierId", label: "Supplier", all: "All suppliers", source: "suppliers" },
  { key: "lotId", label: "Lot", all: "All open lots", source: "lots" },
] as const;

export function QueueFiltersBar({ options, filters, onChange }: { options: FilterOptions; filters: Filters; onChange: (f: Filters) => void }) {
  return (
    <div className="flex flex-1 flex-wrap gap-3">
      {FIELDS.map((f) => (
        <label key={f.key} className="min-w-44 flex-1">
          <span className="field-label">{f.label}</span>
          <select className="field-input" value={filters[f.key] ?? ""} onChange={(e) => onChange({ ...filters, [f.key]: e.target.value || undefined })}>
            <option value="">{f.all}</option>
            {options[f.source].map((o) => (
              <option key={o.id} value={o.id}>
                {"name" in o ? o.name : o.label}
              </option>
            ))}
          </select>
        </label>
      ))}
    </div>
  );
}
