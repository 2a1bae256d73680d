"use client";

import { useId } from "react";
import type { QueueFilters } from "@/lib/queue/schemas";
import type { QueueFilterOptions } from "@/lib/queue/list-params";

const FIELDS = [
  { key: "partTypeId", label: "Part type", all: "All part types", source: "partTypes" },
  { key: "supplierId", label: "Supplier", all: "All suppliers", source: "suppliers" },
  { key: "lotId", label: "Lot", all: "All open lots", source: "lots" },
] as const;

export function QueueFiltersBar({ options, filters, onChange }: { options: QueueFilterOptions; filters: QueueFilters; onChange: (patch: QueueFilters) => void }) {
  const id = useId();
  // Each select is tied to its label by id: a label wrapped around a select would add every
  // option's text to the select's name (a supplier called "Lot …" would answer to "Lot").
  return (
    <div className="flex flex-1 flex-wrap gap-3">
      {FIELDS.map((f) => (
        <div key={f.key} className="min-w-44 flex-1">
          <label htmlFor={`${id}-${f.key}`} className="field-label">
            {f.label}
          </label>
          <select id={`${id}-${f.key}`} className="field-input" value={filters[f.key] ?? ""} onChange={(e) => onChange({ [f.key]: e.target.value || undefined })}>
            <option value="">{f.all}</option>
            {options[f.source].map((o) => (
              <option key={o.id} value={o.id}>
                {"name" in o ? o.name : o.label}
              </option>
            ))}
          </select>
        </div>
      ))}
    </div>
  );
}
