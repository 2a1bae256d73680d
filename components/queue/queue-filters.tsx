"use client";

import type { QueueFilters } from "@/lib/queue/schemas";
import type { QueueFilterOptions } from "@/lib/queue/list-params";

const FIELDS = [
  { key: "partTypeId", label: "Part type", all: "All part types", source: "partTypes" },
  { key: "supplierId", label: "Supplier", all: "All suppliers", source: "suppliers" },
  { key: "lotId", label: "Lot", all: "All open lots", source: "lots" },
] as const;

export function QueueFiltersBar({ options, filters, onChange }: { options: QueueFilterOptions; filters: QueueFilters; onChange: (patch: QueueFilters) => void }) {
  return (
    <div className="flex flex-1 flex-wrap gap-3">
      {FIELDS.map((f) => (
        <label key={f.key} className="min-w-44 flex-1">
          <span className="field-label">{f.label}</span>
          <select className="field-input" value={filters[f.key] ?? ""} onChange={(e) => onChange({ [f.key]: e.target.value || undefined })}>
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
