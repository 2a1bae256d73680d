"use client";

import { useMemo, useState } from "react";
import { evaluateRubric } from "@/lib/grading/evaluate";
import type { Rubric } from "@/lib/grading/rubric-schema";
import { buildSampleUnit, sampleReadingsFor, type SampleReading, type SampleValues } from "@/lib/grading/sample-unit";
import { buildUnitMetrics } from "@/lib/grading/unit-metrics";
import type { PixelFaultClass } from "@/lib/measure/types";
import { GradeBadge } from "./grade-badge";
import { GradeLines } from "./grade-lines";
import type { PartTypeSummary } from "./types";

const UNIT_TEXT: Record<SampleReading["metric"], string> = {
  share: "share, %",
  count: "count",
  maxLengthMm: "longest, mm",
  totalLengthMm: "total length, mm",
  areaMm2: "area, mm²",
  maxDiameterMm: "largest diameter, mm",
};

function readingLabel(reading: SampleReading, labels: PartTypeSummary["labels"]) {
  const zone = reading.zone ? ` on ${labels.zones[reading.zone] ?? reading.zone}` : "";
  const view = reading.view ? ` (${labels.views[reading.view] ?? reading.view} view)` : "";
  return `${labels.defects[reading.defect] ?? reading.defect}${zone}${view} — ${UNIT_TEXT[reading.metric]}`;
}

const PIXEL_OPTIONS: PixelFaultClass[] = ["I", "II", "III", "IV", "beyond"];

/** The sample's values and the grade the rubric gives them, recomputed on every change. */
export function useSamplePreview(rubric: Rubric | null, partType: PartTypeSummary) {
  const [values, setValues] = useState<SampleValues>({ readings: {}, pixelClasses: {}, functionalFailures: { critical: 0, major: 0, minor: 0 } });
  const wanted = useMemo(() => (rubric ? sampleReadingsFor(rubric) : null), [rubric]);
  const result = useMemo(() => {
    if (!rubric) return null;
    const sample = buildSampleUnit(partType.views, rubric, values);
    return evaluateRubric({ rubric, metrics: buildUnitMetrics(sample), defectSeverities: partType.severities, labels: partType.labels });
  }, [rubric, values, partType]);
  return { values, setValues, wanted, result };
}
export type SamplePreview = ReturnType<typeof useSamplePreview>;

/** On narrow screens the rules and the preview are far apart: this bar keeps the sample's grade in view. */
export function PreviewBar({ preview }: { preview: SamplePreview }) {
  if (!preview.result) return null;
  const first = preview.result.lines[0];
  return (
    <div
      className="sticky bottom-0 z-10 -mx-4 -mb-4 mt-4 flex items-center gap-3 border-t border-gauge-200 bg-white/95 px-4 py-2 shadow-[0_-2px_6px_rgba(0,0,0,0.06)] sm:-mx-5 sm:-mb-5 sm:px-5 xl:hidden"
      aria-hidden="true"
    >
      <span className="text-sm font-medium">Sample grade</span>
      <GradeBadge grade={preview.result.grade} />
      <span className="min-w-0 flex-1 truncate text-xs text-gauge-700">{first?.text}</span>
      <a href="#preview-title" className="shrink-0 text-xs underline">
        Preview
      </a>
    </div>
  );
}

/**
 * Live preview: the trainer types sample numbers for what the rubric reads and sees the grade
 * and explanation lines the rubric would give, recomputed on every keystroke (nothing is sent).
 */
export function RubricPreview({ rubric, partType, preview }: { rubric: Rubric | null; partType: PartTypeSummary; preview: SamplePreview }) {
  const { values, setValues, wanted, result } = preview;

  if (!rubric || !wanted || !result) {
    return <p className="text-sm text-gauge-700">The preview runs as soon as every rule is valid.</p>;
  }
  const setReading = (key: string, text: string) => setValues((v) => ({ ...v, readings: { ...v.readings, [key]: text === "" ? 0 : Number(text) } }));
  return (
    <div className="@container" data-testid="rubric-preview">
      <div className="grid gap-4 @3xl:grid-cols-2">
        <div className="space-y-3">
          <p className="text-sm text-gauge-700">Sample unit: type what a unit might measure. Values start at 0 (a clean unit).</p>
          <div className="grid gap-3 @md:grid-cols-2">
            {wanted.readings.map((reading, i) => (
              <div key={reading.key} className="min-w-0">
                <label htmlFor={`sample-${i}`} className="mb-0.5 block text-xs font-medium text-gauge-700">
                  {readingLabel(reading, partType.labels)}
                </label>
                <input
                  id={`sample-${i}`}
                  type="number"
                  min={0}
                  max={reading.metric === "share" ? 100 : undefined}
                  step="any"
                  className="field-input py-1.5"
                  value={values.readings[reading.key] ?? 0}
                  onChange={(e) => setReading(reading.key, e.target.value)}
                />
              </div>
            ))}
            {wanted.pixels.map((pixel, i) => (
              <div key={`px-${pixel.key}`} className="min-w-0">
                <label htmlFor={`sample-px-${i}`} className="mb-0.5 block text-xs font-medium text-gauge-700">
                  Pixel-fault class{pixel.view ? ` (${partType.labels.views[pixel.view] ?? pixel.view} view)` : ""}
                </label>
                <select
                  id={`sample-px-${i}`}
                  className="field-input py-1.5"
                  value={values.pixelClasses[pixel.key] ?? "I"}
                  onChange={(e) => setValues((v) => ({ ...v, pixelClasses: { ...v.pixelClasses, [pixel.key]: e.target.value as PixelFaultClass } }))}
                >
                  {PIXEL_OPTIONS.map((c) => (
                    <option key={c} value={c}>
                      {c === "beyond" ? "beyond class IV" : `class ${c}`}
                    </option>
                  ))}
                </select>
              </div>
            ))}
            {wanted.severities.map((severity) => (
              <div key={severity} className="min-w-0">
                <label htmlFor={`sample-fail-${severity}`} className="mb-0.5 block text-xs font-medium text-gauge-700">
                  Failed {severity} checklist items
                </label>
                <input
                  id={`sample-fail-${severity}`}
                  type="number"
                  min={0}
                  step={1}
                  className="field-input py-1.5"
                  value={values.functionalFailures[severity]}
                  onChange={(e) => setValues((v) => ({ ...v, functionalFailures: { ...v.functionalFailures, [severity]: Math.max(0, Math.round(Number(e.target.value) || 0)) } }))}
                />
              </div>
            ))}
          </div>
          {wanted.readings.length + wanted.pixels.length + wanted.severities.length === 0 && <p className="text-sm text-gauge-700">Add rules to have something to try.</p>}
        </div>
        <div className="order-first space-y-3 self-start rounded-md border border-gauge-200 bg-gauge-50 p-3 @3xl:order-last" aria-live="polite">
          <div className="flex items-center gap-3">
            <span className="text-sm font-medium">Grade for this sample</span>
            <GradeBadge grade={result.grade} size="lg" testId="preview-grade" />
          </div>
          <GradeLines lines={result.lines} notes={result.notes} testId="preview-lines" />
        </div>
      </div>
    </div>
  );
}
