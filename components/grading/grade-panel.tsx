"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useRef, useState } from "react";
import { useForm, useWatch, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { FormMessage } from "@/components/ui/form-field";
import { useDateTime } from "@/components/ui/time-zone";
import { useHydrated } from "@/components/ui/use-hydrated";
import { GRADES } from "@/lib/grading/rubric-schema";
import { MAX_REASON_LENGTH, recordGradeSchema } from "@/lib/grading/schemas";
import { ApiError, apiFetch } from "@/lib/http/client";
import { GradeBadge } from "./grade-badge";
import { GradeLines } from "./grade-lines";
import { MeasurementTable, type MeasurementLabels } from "./measurement-table";
import { type GradeView, type MeasurementView } from "./types";
import { unitKeys } from "@/lib/query-keys/units";

export type { MeasurementLabels } from "./measurement-table";

type GradePanelProps = {
  unitId: string;
  canGrade: boolean;
  canCorrect: boolean;
  /** Names for classes, zones and views in the measurement table (keys shown without them). */
  labels?: MeasurementLabels;
  /** Region edits are still being saved: measuring now would read the older regions. */
  unsavedRegions?: boolean;
  /** Runs before measuring (the Bench saves pending regions); false stops the measurement. */
  beforeMeasure?: () => Promise<boolean>;
  /** After a grade is recorded (the unit moved on). */
  onGraded?: () => void;
  /** Why this person cannot measure or grade the unit now (the Bench's read-only reason), or null. */
  readOnlyReason?: string | null;
  /** In a card with its own large heading (default), or bare inside a panel that has one. */
  framed?: boolean;
};

type MeasureState = { measurement: MeasurementView | null; job: { id: string; state: string; notMeasured?: string | null } | null };
type FormValues = z.input<typeof recordGradeSchema>;

/** Inputs that are hidden or left empty are absent, not "" (an accept needs no final grade). */
function cleaned(values: FormValues): FormValues {
  const { finalGrade, reason, ...rest } = values as FormValues & { finalGrade?: string; reason?: string };
  return {
    ...rest,
    ...(values.decision === "override" && finalGrade ? { finalGrade } : {}),
    ...(reason?.trim() ? { reason } : values.decision === "override" ? { reason: reason ?? "" } : {}),
  } as FormValues;
}
const schemaResolver = zodResolver(recordGradeSchema);

/** The override grades the form offers (every grade but the proposal), as a sentence: never names one that is not offered. */
export function offeredGradesSentence(proposed: string | undefined): string {
  const offered = GRADES.filter((g) => g !== proposed);
  return `Choose the final grade: ${offered.slice(0, -1).join(", ")} or ${offered.at(-1)}.`;
}
const resolver: Resolver<FormValues> = (values, context, options) => schemaResolver(cleaned(values), context, options) as ReturnType<Resolver<FormValues>>;

/** Measuring a unit and recording its grade: the numbers, the proposal with its reasons, accept or override. */
export function GradePanel(props: GradePanelProps) {
  const { unitId, canGrade, canCorrect, labels = { defects: {}, zones: {}, views: {} }, unsavedRegions = false, beforeMeasure, onGraded, readOnlyReason = null, framed = true } = props;
  const dateTime = useDateTime();
  // A click on "Measure now" before React attaches its handler would be lost on a slow tablet.
  const hydrated = useHydrated();
  const queryClient = useQueryClient();
  const [jobId, setJobId] = useState<string | null>(null);
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const state = useQuery({
    queryKey: unitKeys.measurement(unitId, jobId),
    queryFn: () => apiFetch<MeasureState>(`/api/units/${unitId}/measure${jobId ? `?jobId=${jobId}` : ""}`),
    // While a background measurement runs, look again every 2 s until the job is done.
    refetchInterval: (query) => (jobId && !["completed", "failed", "cancelled"].includes(query.state.data?.job?.state ?? "") ? 2000 : false),
  });
  // Shares its cache with GradeHistory: a lead may correct only a unit that already has a grade.
  const history = useQuery({ queryKey: unitKeys.grades(unitId), queryFn: () => apiFetch<{ grades: GradeView[] }>(`/api/units/${unitId}/grades`) });
  const current = history.data?.grades.at(-1) ?? null;
  // Once graded, the only new grade is a lead's correction naming the grade it replaces.
  const hasGrade = current !== null;
  const refresh = () => {
    void queryClient.invalidateQueries({ queryKey: unitKeys.measurement(unitId) });
    void queryClient.invalidateQueries({ queryKey: unitKeys.grades(unitId) });
    void queryClient.invalidateQueries({ queryKey: unitKeys.gradePreview(unitId) });
  };
  const measure = useMutation({
    mutationFn: async () => {
      if (beforeMeasure && !(await beforeMeasure()))
        throw new Error("Some region edits could not be saved yet, so measuring now would use older regions. Wait until they are saved (see the status above the photo), then measure.");
      return apiFetch<{ status: "measured" | "queued"; jobId?: string | null; message?: string }>(`/api/units/${unitId}/measure`, { method: "POST" });
    },
    onSuccess: (res) => {
      setMessage(res.status === "queued" ? { kind: "success", text: res.message ?? "Measuring in the background." } : null);
      setJobId(res.status === "queued" ? (res.jobId ?? null) : null);
      refresh();
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });

  const { register, handleSubmit, control, reset, setError, formState } = useForm<FormValues>({ resolver, defaultValues: { decision: "accept" } });
  const decision = useWatch({ control, name: "decision" });
  const correction = hasGrade;
  // A recorded grade folds the form away; a lead opens it again to correct the grade.
  const [correcting, setCorrecting] = useState(false);
  // One key per submission: a retried or doubled request is answered with the same grade row.
  const submissionKey = useRef<string | null>(null);
  const grade = useMutation({
    mutationFn: (values: FormValues) => {
      submissionKey.current ??= crypto.randomUUID();
      const replaces = correction ? { kind: "override" as const, expectedCurrentGradeId: current?.id } : { expectedCurrentGradeId: null };
      return apiFetch<{ grade: GradeView }>(`/api/units/${unitId}/grades`, {
        body: { ...cleaned(values), measurementId: state.data?.measurement?.id, ...replaces, idempotencyKey: submissionKey.current },
      });
    },
    onSuccess: (res) => {
      submissionKey.current = null;
      setMessage({ kind: "success", text: `Grade ${res.grade.finalGrade} recorded.` });
      reset({ decision: "accept" });
      setCorrecting(false);
      refresh();
      onGraded?.();
    },
    onError: (err) => {
      if (err instanceof ApiError) for (const [field, text] of Object.entries(err.fieldErrors)) if (field === "reason" || field === "finalGrade") setError(field, { message: text });
      setMessage({ kind: "error", text: err.message });
    },
  });

  const m = state.data?.measurement ?? null;
  const proposed = m?.proposal.grade;
  const running = jobId !== null && !["completed", "failed", "cancelled"].includes(state.data?.job?.state ?? "");
  const errors = formState.errors as { reason?: { message?: string }; finalGrade?: { message?: string; type?: string } };
  // The schema's own message lists every grade; the form offers all but the proposal, so it says those.
  const finalGradeError = errors.finalGrade ? (errors.finalGrade.type ? offeredGradesSentence(proposed) : errors.finalGrade.message) : null;
  const gradable = Boolean(m && !m.stale && canGrade && readOnlyReason === null);

  return (
    <section className={framed ? "card space-y-4 p-4 sm:p-5" : "space-y-3"} aria-labelledby="grade-panel-title" data-testid="grade-panel">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="grade-panel-title" className={framed ? "text-lg font-semibold" : "text-sm font-semibold"}>
          Measurement and proposed grade
        </h2>
        {canGrade && (
          <button
            type="button"
            className="btn-secondary"
            onClick={() => measure.mutate()}
            disabled={!hydrated || measure.isPending || running || readOnlyReason !== null}
            title={readOnlyReason ?? undefined}
          >
            {measure.isPending ? "Measuring…" : running ? "Measuring in the background…" : m ? "Measure again" : "Measure now"}
          </button>
        )}
      </div>
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      {state.isPending && <p className="text-sm text-gauge-700">Loading the latest measurement…</p>}
      {state.isError && <FormMessage kind="error">{state.error.message}</FormMessage>}
      {state.data?.job?.notMeasured && <FormMessage kind="error">{state.data.job.notMeasured}</FormMessage>}
      {state.isSuccess && !m && <p className="text-sm text-gauge-700">Not measured yet.</p>}
      {m && (
        <div className="space-y-3">
          <div className="flex flex-wrap items-center gap-3">
            <span className="text-sm">Proposed under rubric version {m.rubricVersion}:</span>
            <GradeBadge grade={m.proposal.grade} size="lg" testId="proposed-grade" />
            <span className="text-xs text-gauge-700">
              measured {dateTime(m.createdAt)}
              {m.createdByName ? ` by ${m.createdByName}` : ""}
            </span>
          </div>
          {m.stale && (
            <div role="alert" className="rounded-md border border-signal-500 bg-signal-50 px-3 py-2 text-sm text-signal-700" data-testid="measurement-stale">
              <p className="font-medium">This measurement is out of date and cannot be graded. Measure again.</p>
              <ul className="list-disc pl-5">
                {m.reasons.map((r) => (
                  <li key={r}>{r}</li>
                ))}
              </ul>
            </div>
          )}
          <GradeLines lines={m.proposal.lines} notes={m.proposal.notes} testId="proposal-lines" />
          <MeasurementTable photos={m.photos} labels={labels} />
        </div>
      )}
      {gradable && hasGrade && canCorrect && !correcting && (
        <button type="button" className="btn-secondary" onClick={() => setCorrecting(true)} data-testid="correct-grade">
          Correct this grade…
        </button>
      )}
      {gradable && (!hasGrade || (canCorrect && correcting)) && (
        <form onSubmit={handleSubmit((values) => grade.mutate(values))} noValidate className="space-y-3 border-t border-gauge-100 pt-4" aria-label="Record the grade">
          <fieldset className="flex flex-wrap gap-4">
            <legend className="field-label">Decision</legend>
            <label className="flex items-center gap-2 text-sm">
              <input type="radio" value="accept" {...register("decision")} /> Accept {proposed}
            </label>
            <label className="flex items-center gap-2 text-sm">
              <input type="radio" value="override" {...register("decision")} /> Override
            </label>
          </fieldset>
          {decision === "override" && (
            <div className="grid gap-3 sm:grid-cols-[10rem_minmax(0,1fr)]">
              <div>
                <label htmlFor="final-grade" className="field-label">
                  Final grade
                </label>
                <select id="final-grade" className="field-input" aria-invalid={errors.finalGrade ? true : undefined} {...register("finalGrade")}>
                  <option value="">Choose…</option>
                  {GRADES.filter((g) => g !== proposed).map((g) => (
                    <option key={g} value={g}>
                      {g}
                    </option>
                  ))}
                </select>
                {finalGradeError && <p className="field-error">{finalGradeError}</p>}
              </div>
              <div>
                <label htmlFor="override-reason" className="field-label">
                  Reason (required)
                </label>
                <textarea
                  id="override-reason"
                  rows={3}
                  maxLength={MAX_REASON_LENGTH}
                  className="field-input"
                  aria-invalid={errors.reason ? true : undefined}
                  aria-describedby={errors.reason ? "override-reason-error" : undefined}
                  {...register("reason")}
                />
                {errors.reason?.message && (
                  <p id="override-reason-error" className="field-error" aria-live="polite">
                    {errors.reason.message}
                  </p>
                )}
              </div>
            </div>
          )}
          {correction && current && (
            <p className="text-sm text-gauge-700" data-testid="correction-note">
              This unit is graded {current.finalGrade}. What you record here is a lead&rsquo;s correction of that grade and needs a reason.
            </p>
          )}
          {correction && decision === "accept" && (
            <div>
              <label htmlFor="correction-reason" className="field-label">
                Reason for the correction
              </label>
              <textarea id="correction-reason" rows={2} maxLength={MAX_REASON_LENGTH} className="field-input" {...register("reason")} />
              {errors.reason?.message && <p className="field-error">{errors.reason.message}</p>}
            </div>
          )}
          {unsavedRegions && <p className="text-sm text-signal-700">Region edits are not saved yet; once they are, this measurement is out of date and must be measured again.</p>}
          <div className="flex gap-2">
            <button type="submit" className="btn-primary" disabled={grade.isPending || unsavedRegions}>
              {grade.isPending ? "Recording…" : "Record grade"}
            </button>
            {correcting && (
              <button type="button" className="btn-secondary" onClick={() => setCorrecting(false)}>
                Cancel
              </button>
            )}
          </div>
        </form>
      )}
    </section>
  );
}
