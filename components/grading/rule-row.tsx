"use client";

import { useState } from "react";
import { useWatch, type Control, type FieldErrors, type UseFormRegister } from "react-hook-form";
import { takesDefect, takesView, takesZone, type RubricFormValues } from "@/lib/grading/rule-form";
import { METRICS, RULE_GRADES, parseRubric, type Metric } from "@/lib/grading/rubric-schema";
import { DEFECT_SEVERITIES } from "@/lib/part-types/severity";
import { describeRule } from "@/lib/grading/rule-text";
import { toRule } from "@/lib/grading/rule-form";
import { GradeBadge } from "./grade-badge";
import type { PartTypeSummary } from "./types";

export const METRIC_LABELS: Record<Metric, string> = {
  share: "Share (%)",
  count: "Count",
  maxLengthMm: "Longest line (mm)",
  totalLengthMm: "Total length (mm)",
  areaMm2: "Area (mm²)",
  maxDiameterMm: "Largest spot (mm)",
  pixelFaultClass: "Pixel-fault class",
  functionalFailures: "Failed checklist items",
};

const PIXEL_CLASSES = ["I", "II", "III", "IV"] as const;

function Field({ id, label, error, children, className = "" }: { id: string; label: string; error?: string; children: React.ReactNode; className?: string }) {
  return (
    <div className={`min-w-0 ${className}`}>
      <label htmlFor={id} className="mb-0.5 block text-xs font-medium text-gauge-700">
        {label}
      </label>
      {children}
      {error && (
        <p id={`${id}-error`} className="mt-0.5 text-xs text-fault-700" aria-live="polite">
          {error}
        </p>
      )}
    </div>
  );
}

const inputClass = "field-input py-1.5";

/** A field this rule's measure does not take, shown as a fixed text so the row keeps its shape. */
function NotUsed({ id, text }: { id: string; text: string }) {
  return <input id={id} className={`${inputClass} border-dashed bg-gauge-50 text-gauge-600`} value={text} readOnly tabIndex={-1} />;
}

/** One rule of the draft: which number it reads, the limit, and the grade it gives. */
export function RuleRow({
  index,
  control,
  register,
  errors,
  partType,
  onRemove,
  onMove,
  isFirst,
  isLast,
  startOpen = false,
  onMetricChange,
}: {
  index: number;
  control: Control<RubricFormValues>;
  register: UseFormRegister<RubricFormValues>;
  errors: FieldErrors<RubricFormValues>;
  partType: PartTypeSummary;
  onRemove: () => void;
  onMove: (delta: -1 | 1) => void;
  isFirst: boolean;
  isLast: boolean;
  /** New rows open for editing; saved ones show as a sentence until "Edit". */
  startOpen?: boolean;
  /** Lets the editor adjust the threshold when the measure changes between a number and a class. */
  onMetricChange: (metric: Metric) => void;
}) {
  const [open, setOpen] = useState(startOpen);
  const row = useWatch({ control, name: `rules.${index}` });
  const metric = row?.metric ?? "count";
  const rowErrors = errors.rules?.[index];
  const id = (field: string) => `rule-${index}-${field}`;
  const describedBy = (field: keyof NonNullable<typeof rowErrors>) => (rowErrors?.[field] ? `${id(String(field))}-error` : undefined);
  const invalid = (field: keyof NonNullable<typeof rowErrors>) => (rowErrors?.[field] ? true : undefined);
  const { labels, lists } = partType;
  // The rule in words, when this row on its own is valid.
  const single = row ? parseRubric({ rules: [toRule(row as RubricFormValues["rules"][number])] }, lists) : null;
  const sentence = single?.ok ? describeRule(single.rubric.rules[0], labels) : null;
  // A row with a problem stays open, so the message is always next to its field.
  const expanded = open || rowErrors !== undefined || sentence === null;
  const grade = row?.grade;

  const actions = (
    <div className="flex shrink-0 gap-1">
      {!expanded && (
        <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={() => setOpen(true)} aria-label={`Edit rule ${index + 1}`}>
          Edit
        </button>
      )}
      {expanded && open && rowErrors === undefined && sentence !== null && (
        <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={() => setOpen(false)}>
          Done
        </button>
      )}
      <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={() => onMove(-1)} disabled={isFirst} aria-label={`Move rule ${index + 1} up`}>
        ↑
      </button>
      <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={() => onMove(1)} disabled={isLast} aria-label={`Move rule ${index + 1} down`}>
        ↓
      </button>
      <button type="button" className="btn-danger px-2 py-1 text-xs" onClick={onRemove} aria-label={`Remove rule ${index + 1}`}>
        Remove
      </button>
    </div>
  );

  if (!expanded) {
    return (
      <li className="flex flex-wrap items-center gap-2 rounded-md border border-gauge-200 bg-white px-3 py-2 sm:flex-nowrap" data-testid={`rule-row-${index}`}>
        <span className="flex min-w-0 flex-1 flex-wrap items-center gap-x-2 gap-y-0.5 text-sm">
          {grade && <GradeBadge grade={grade} size="sm" />}
          <span className="min-w-0 break-words">{sentence?.replace(/ → \S+$/, "")}</span>
          <span className="font-mono text-xs text-gauge-600">{row?.id}</span>
        </span>
        {actions}
      </li>
    );
  }

  return (
    <li className="rounded-md border border-gauge-200 bg-white p-3" data-testid={`rule-row-${index}`}>
      <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
        <Field id={id("id")} label="Rule id" error={rowErrors?.id?.message}>
          <input id={id("id")} className={inputClass} aria-invalid={invalid("id")} aria-describedby={describedBy("id")} {...register(`rules.${index}.id`)} />
        </Field>
        <Field id={id("metric")} label="Measure" error={rowErrors?.metric?.message}>
          <select
            id={id("metric")}
            className={inputClass}
            aria-invalid={invalid("metric")}
            aria-describedby={describedBy("metric")}
            {...register(`rules.${index}.metric`, { onChange: (e: { target: { value: Metric } }) => onMetricChange(e.target.value) })}
          >
            {METRICS.map((m) => (
              <option key={m} value={m}>
                {METRIC_LABELS[m]}
              </option>
            ))}
          </select>
        </Field>
        {metric === "functionalFailures" ? (
          <Field id={id("severity")} label="Severity" error={rowErrors?.severity?.message}>
            <select id={id("severity")} className={inputClass} {...register(`rules.${index}.severity`)}>
              {DEFECT_SEVERITIES.map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </select>
          </Field>
        ) : (
          <Field id={id("defect")} label="Defect class" error={rowErrors?.defect?.message}>
            {takesDefect(metric) ? (
              <select id={id("defect")} className={inputClass} aria-invalid={invalid("defect")} aria-describedby={describedBy("defect")} {...register(`rules.${index}.defect`)}>
                {lists.defects.map((d) => (
                  <option key={d} value={d}>
                    {labels.defects[d] ?? d}
                  </option>
                ))}
              </select>
            ) : (
              <NotUsed id={id("defect")} text="all pixel-fault Spots" />
            )}
          </Field>
        )}
        <Field id={id("view")} label="View" error={rowErrors?.view?.message}>
          {takesView(metric) ? (
            <select id={id("view")} className={inputClass} aria-invalid={invalid("view")} aria-describedby={describedBy("view")} {...register(`rules.${index}.view`)}>
              <option value="">Any view</option>
              {lists.views.map((v) => (
                <option key={v} value={v}>
                  {labels.views[v] ?? v}
                </option>
              ))}
            </select>
          ) : (
            <NotUsed id={id("view")} text="the whole unit" />
          )}
        </Field>
        <Field id={id("zone")} label="Zone" error={rowErrors?.zone?.message}>
          {takesZone(metric) ? (
            <select id={id("zone")} className={inputClass} aria-invalid={invalid("zone")} aria-describedby={describedBy("zone")} {...register(`rules.${index}.zone`)}>
              <option value="">Whole surface</option>
              {lists.zones.map((z) => (
                <option key={z} value={z}>
                  {labels.zones[z] ?? z}
                </option>
              ))}
            </select>
          ) : (
            <NotUsed id={id("zone")} text="share and area rules only" />
          )}
        </Field>
        <Field id={id("comparison")} label="Fires when" error={rowErrors?.comparison?.message}>
          {metric === "pixelFaultClass" ? (
            <NotUsed id={id("comparison")} text="worse than" />
          ) : (
            <select id={id("comparison")} className={inputClass} {...register(`rules.${index}.comparison`)}>
              <option value=">">greater than</option>
              <option value=">=">at least</option>
            </select>
          )}
        </Field>
        <Field id={id("threshold")} label={metric === "share" ? "Threshold (%)" : metric === "pixelFaultClass" ? "Class" : "Threshold"} error={rowErrors?.threshold?.message}>
          {metric === "pixelFaultClass" ? (
            <select id={id("threshold")} className={inputClass} aria-invalid={invalid("threshold")} aria-describedby={describedBy("threshold")} {...register(`rules.${index}.threshold`)}>
              <option value="">Choose…</option>
              {PIXEL_CLASSES.map((c) => (
                <option key={c} value={c}>
                  class {c}
                </option>
              ))}
            </select>
          ) : (
            <input
              id={id("threshold")}
              inputMode="decimal"
              className={inputClass}
              aria-invalid={invalid("threshold")}
              aria-describedby={describedBy("threshold")}
              {...register(`rules.${index}.threshold`)}
            />
          )}
        </Field>
        <Field id={id("grade")} label="Grade" error={rowErrors?.grade?.message}>
          <select id={id("grade")} className={inputClass} {...register(`rules.${index}.grade`)}>
            {RULE_GRADES.map((g) => (
              <option key={g} value={g}>
                {g}
              </option>
            ))}
          </select>
        </Field>
      </div>
      <div className="mt-2 flex flex-wrap items-center justify-between gap-2">
        <p className="min-w-0 text-sm text-gauge-700">{sentence ?? "\u00a0"}</p>
        {actions}
      </div>
    </li>
  );
}
