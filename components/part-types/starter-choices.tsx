import type { UseFormRegisterReturn } from "react-hook-form";
import { CATEGORY_LABELS, type PartCategory } from "@/lib/part-types/schemas";

export type StarterChoice = { slug: string; name: string; category: string; views: number; checklist: number };

/**
 * The starter part types as checkboxes (one name, so a form reads the checked slugs as a list),
 * with what each brings. Used by sign-up and by an empty Part types screen.
 */
export function StarterChoices({ choices, registration, idPrefix, columns = 1 }: { choices: readonly StarterChoice[]; registration: UseFormRegisterReturn; idPrefix: string; columns?: 1 | 2 }) {
  return (
    <ul className={`grid gap-1.5 ${columns === 2 ? "sm:grid-cols-2" : ""}`} data-testid="starter-choices">
      {choices.map((c) => (
        <li key={c.slug}>
          <label htmlFor={`${idPrefix}-${c.slug}`} className="flex items-start gap-2 text-sm">
            <input id={`${idPrefix}-${c.slug}`} type="checkbox" value={c.slug} className="mt-0.5" {...registration} />
            <span>
              <span className="font-medium">{c.name}</span>
              <span className="block text-xs text-gauge-600">
                {CATEGORY_LABELS[c.category as PartCategory] ?? c.category} · {c.views} views · {c.checklist} checklist items
              </span>
            </span>
          </label>
        </li>
      ))}
    </ul>
  );
}
