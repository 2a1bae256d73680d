"use client";

import { useRouter } from "next/navigation";
import { useTransition } from "react";
import { galleryHref, type FilterKey, type GalleryFilters } from "@/lib/gallery/search-params";
import { GRADES } from "@/lib/grading/rubric-schema";

export type FilterPartType = { id: string; name: string; views: { key: string; label: string }[]; defectClasses: { key: string; label: string }[] };

/**
 * The Gallery's filters. Each choice is a new URL (router.push), so the back button steps through
 * the filters and a copied link opens the same view; the server page renders the result.
 */
export function GalleryFilters({ filters, partTypes, canEdit }: { filters: GalleryFilters; partTypes: FilterPartType[]; canEdit: boolean }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const partType = partTypes.find((p) => p.id === filters.partType);
  // Without a part type, every class any part type has (keys are shared: a scratch is a scratch).
  const classes = partType?.defectClasses ?? [...new Map(partTypes.flatMap((p) => p.defectClasses).map((d) => [d.key, d])).values()].sort((a, b) => a.label.localeCompare(b.label));
  const set = (key: FilterKey) => (e: React.ChangeEvent<HTMLSelectElement>) => startTransition(() => router.push(galleryHref(filters, { [key]: e.target.value || undefined })));
  const select = (key: FilterKey, label: string, options: { value: string; label: string }[], anyLabel: string, disabled = false) => (
    <label className="flex min-w-0 flex-col text-xs font-medium text-gauge-800">
      {label}
      <select className="field-input mt-0.5 py-1.5" value={filters[key] ?? ""} onChange={set(key)} disabled={disabled} data-testid={`filter-${key}`}>
        <option value="">{anyLabel}</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </label>
  );
  // Columns of at least 10.5rem (as many as fit: six beside each other at 1440 px, four at 1024 px),
  // wide enough for each label on one line and each choice's longest default text.
  return (
    <form role="search" aria-label="Gallery filters" className="grid grid-cols-2 gap-2 sm:grid-cols-[repeat(auto-fill,minmax(10.5rem,1fr))]" aria-busy={pending} onSubmit={(e) => e.preventDefault()}>
      {select(
        "partType",
        "Part type",
        partTypes.map((p) => ({ value: p.id, label: p.name })),
        "Every part type",
      )}
      {select("view", "View", partType?.views.map((v) => ({ value: v.key, label: v.label })) ?? [], partType ? "Every view" : "Pick a part type", !partType)}
      {select(
        "defect",
        "Defect class",
        classes.map((d) => ({ value: d.key, label: d.label })),
        "Every class",
      )}
      {select(
        "kind",
        "Normal or abnormal",
        [
          { value: "normal", label: "Normal" },
          { value: "abnormal", label: "Abnormal" },
        ],
        "Both",
      )}
      {select(
        "grade",
        "Grade",
        GRADES.map((g) => ({ value: g, label: g })),
        "Every grade",
      )}
      {canEdit &&
        select(
          "status",
          "Status",
          [
            { value: "draft", label: "Drafts" },
            { value: "published", label: "Published" },
            { value: "retired", label: "Retired" },
          ],
          "All but retired",
        )}
    </form>
  );
}
