"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useRef, useState } from "react";
import { AnnotationCanvasLazy } from "@/components/annotate/annotation-canvas-lazy";
import type { AllowedDefect, ZoneInput } from "@/components/annotate/types";
import type { MeasurementLabels } from "@/components/grading/measurement-table";
import { BatteryCaution, StaticCaution } from "@/components/ui/cautions";
import { FormMessage } from "@/components/ui/form-field";
import type { CalibrationAnswer, CalibrationAnswers } from "@/lib/calibration/types";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { apiFetch } from "@/lib/http/client";
import { AnswerMeasurementPanel } from "./answer-measurement";

/** One item as a taker sees it before submitting: where it is and what to mark it with, nothing of the key. */
export type BlindItem = {
  position: number;
  partTypeName: string;
  /** A battery or a static-sensitive part shows the Bench's cautions. */
  cautions: { battery: boolean; staticSensitive: boolean };
  viewLabel: string;
  width: number | null;
  height: number | null;
  previewWidth: number | null;
  previewHeight: number | null;
  allowedDefects: AllowedDefect[];
  zones: ZoneInput[];
  labels: MeasurementLabels;
};

const EMPTY: RegionSetPayload = { regions: [], surfaces: [], ruler: null };
/** Region edits are saved this long after the last one (a grade is saved at once). */
const SAVE_DELAY_MS = 700;

type SaveState = { kind: "saved" } | { kind: "pending" } | { kind: "saving" } | { kind: "failed"; message: string; position: number };

/**
 * Taking a calibration set, blind: each photo on the Bench's canvas with its tools, and a grade.
 * Every change is saved to the attempt (regions shortly after the last edit, a grade at once), so
 * leaving the page pauses the attempt and opening it again resumes it. Saves go one at a time in
 * order; moving to another item first sends what is pending. Submitting needs a grade on every
 * item; afterwards the page shows the result with the key.
 */
export function AttemptTaker({ attemptId, setName, items, initialAnswers }: { attemptId: string; setName: string; items: BlindItem[]; initialAnswers: CalibrationAnswers }) {
  const router = useRouter();
  const [answers, setAnswers] = useState<CalibrationAnswers>(initialAnswers);
  const [position, setPosition] = useState(() => items.find((i) => !initialAnswers[String(i.position)]?.grade)?.position ?? items[0].position);
  const [saveState, setSaveState] = useState<SaveState>({ kind: "saved" });
  const [confirming, setConfirming] = useState(false);
  const answersRef = useRef(answers);
  const chain = useRef<Promise<void>>(Promise.resolve());
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const pendingPosition = useRef<number | null>(null);
  const inFlight = useRef(0);

  /** Changes item p's answer here (the ref at once, for saves queued before the next render). */
  const update = useCallback((p: number, change: Partial<CalibrationAnswer>) => {
    const before = answersRef.current[String(p)] ?? { grade: null, regions: EMPTY, savedAt: "" };
    answersRef.current = { ...answersRef.current, [String(p)]: { ...before, ...change } };
    setAnswers(answersRef.current);
  }, []);

  /**
   * Queues a save of item p's current answer behind any save in flight. "Saving" shows from the
   * moment it is queued, and "saved" only once nothing is queued or waiting: a test (or a person)
   * that waits for "saved" knows every answer has reached the server.
   */
  const send = useCallback(
    (p: number) => {
      inFlight.current++;
      setSaveState((now) => (now.kind === "failed" && now.position !== p ? now : { kind: "saving" }));
      chain.current = chain.current.then(async () => {
        const { grade, regions } = answersRef.current[String(p)] ?? { grade: null, regions: EMPTY };
        try {
          const saved = await apiFetch<{ answer: CalibrationAnswer }>(`/api/calibration/attempts/${attemptId}/answers`, { method: "PUT", body: { position: p, grade, regions } });
          // Only the time is taken from the server: newer edits made meanwhile stay as they are.
          update(p, { savedAt: saved.answer.savedAt });
          inFlight.current--;
          // A failed save of another item stays on show until that item is saved.
          if (inFlight.current === 0) setSaveState((now) => (now.kind === "failed" && now.position !== p ? now : pendingPosition.current === null ? { kind: "saved" } : { kind: "pending" }));
        } catch (err) {
          inFlight.current--;
          setSaveState({ kind: "failed", message: err instanceof Error ? err.message : "The answer was not saved.", position: p });
        }
      });
      return chain.current;
    },
    [attemptId, update],
  );

  const flush = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    const p = pendingPosition.current;
    pendingPosition.current = null;
    return p === null ? chain.current : send(p);
  }, [send]);

  useEffect(() => () => void flush(), [flush]);

  const onRegions = (payload: RegionSetPayload) => {
    update(position, { regions: payload });
    if (pendingPosition.current !== null && pendingPosition.current !== position) void flush();
    pendingPosition.current = position;
    setSaveState({ kind: "pending" });
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void flush(), SAVE_DELAY_MS);
  };
  const onGrade = (grade: Grade) => {
    update(position, { grade });
    pendingPosition.current = position;
    void flush();
  };
  const go = (p: number) => {
    void flush();
    setPosition(p);
  };

  const submit = useMutation({
    mutationFn: async () => {
      await flush();
      return apiFetch(`/api/calibration/attempts/${attemptId}/submit`, { method: "POST" });
    },
    onSuccess: () => router.refresh(),
  });

  const item = items.find((i) => i.position === position)!;
  const index = items.indexOf(item);
  const answer = answers[String(position)];
  const graded = items.filter((i) => answers[String(i.position)]?.grade).length;
  return (
    <div className="space-y-3" data-testid="attempt-taker" data-position={position}>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm text-gauge-700">Calibration · taken blind: the answer shows after you submit</p>
          <h1 className="page-title">{setName}</h1>
        </div>
        <p className="text-sm" role="status" aria-live="polite" data-testid="answer-save-state" data-state={saveState.kind}>
          {saveState.kind === "saved" ? "All answers saved. You can leave and resume later." : saveState.kind === "failed" ? "" : "Saving…"}
        </p>
      </div>
      {saveState.kind === "failed" && (
        <FormMessage kind="error">
          {saveState.message}{" "}
          <button type="button" className="font-medium underline" onClick={() => void send(saveState.position)}>
            Try again
          </button>
        </FormMessage>
      )}
      <nav aria-label="Items of the set" className="flex flex-wrap gap-1" data-testid="attempt-items">
        {items.map((i) => {
          const done = Boolean(answers[String(i.position)]?.grade);
          return (
            <button
              key={i.position}
              type="button"
              onClick={() => go(i.position)}
              aria-current={i.position === position ? "step" : undefined}
              className={`min-w-10 rounded-md border px-2 py-1 text-sm tabular-nums ${i.position === position ? "border-gauge-800 bg-gauge-800 text-white" : done ? "border-ok-600 bg-ok-50" : "border-gauge-300 bg-white"}`}
              data-testid="attempt-item-button"
              data-done={done}
            >
              {i.position}
              {done && <span className="sr-only"> (graded)</span>}
            </button>
          );
        })}
      </nav>
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className="flex h-[64vh] min-h-[320px] flex-col" data-testid="attempt-canvas">
          {item.width && item.height && item.previewWidth && item.previewHeight ? (
            <AnnotationCanvasLazy
              key={position}
              imageUrl={`/api/calibration/attempts/${attemptId}/image?position=${position}&variant=preview`}
              original={{ width: item.width, height: item.height }}
              preview={{ width: item.previewWidth, height: item.previewHeight }}
              allowedDefects={item.allowedDefects}
              zones={item.zones}
              initialRegions={answer?.regions ?? EMPTY}
              onChange={onRegions}
              className="min-h-0 flex-1"
            />
          ) : (
            <p className="flex flex-1 items-center justify-center rounded-lg border border-dashed border-gauge-300 p-6 text-sm text-gauge-700">
              This item&apos;s photo is not available; tell your trainer.
            </p>
          )}
        </div>
        <div className="card space-y-3 self-start p-4">
          <p className="font-medium">
            Item {position} of {items.length}
          </p>
          <p className="text-sm text-gauge-700">
            {item.partTypeName} · {item.viewLabel}
          </p>
          {/* As on the Bench: what is learnt from the photo is what to do with such a part in hand. */}
          {item.cautions.battery && <BatteryCaution className="text-xs" />}
          {item.cautions.staticSensitive && <StaticCaution className="text-xs" />}
          <fieldset>
            <legend className="field-label">Your grade</legend>
            <div className="mt-1 grid grid-cols-4 gap-1">
              {GRADES.map((g) => (
                <label
                  key={g}
                  className={`cursor-pointer rounded-md border px-2 py-1.5 text-center text-sm font-semibold ${answer?.grade === g ? "border-gauge-800 bg-gauge-800 text-white" : "border-gauge-300"}`}
                >
                  <input type="radio" name="grade" value={g} checked={answer?.grade === g} onChange={() => onGrade(g)} className="sr-only" data-testid={`answer-grade-${g}`} />
                  {g}
                </label>
              ))}
            </div>
          </fieldset>
          <p className="text-xs text-gauge-700">Mark every defect you see with the tools beside the photo, as on the Bench, then choose the grade. A normal part needs no marks.</p>
          {answer?.savedAt && <AnswerMeasurementPanel attemptId={attemptId} position={position} savedAt={answer.savedAt} labels={item.labels} />}
          <div className="flex gap-2">
            <button type="button" className="btn-secondary" disabled={index === 0} onClick={() => go(items[index - 1].position)}>
              Previous
            </button>
            <button type="button" className="btn-secondary" disabled={index === items.length - 1} onClick={() => go(items[index + 1].position)} data-testid="next-item">
              Next
            </button>
          </div>
          <hr className="border-gauge-200" />
          <p className="text-sm" data-testid="graded-count">
            {graded} of {items.length} graded
          </p>
          {submit.error && <FormMessage kind="error">{submit.error.message}</FormMessage>}
          {confirming ? (
            <div className="space-y-2 rounded-md border border-signal-500 bg-signal-100 p-2 text-sm" role="group" aria-label="Confirm submission">
              <p>Submit now? Your answers can no longer change, and you will see the key.</p>
              <div className="flex gap-2">
                <button type="button" className="btn-primary" disabled={submit.isPending || submit.isSuccess} onClick={() => submit.mutate()} data-testid="confirm-submit">
                  {submit.isPending || submit.isSuccess ? "Scoring…" : "Yes, submit"}
                </button>
                <button type="button" className="btn-secondary" disabled={submit.isPending || submit.isSuccess} onClick={() => setConfirming(false)}>
                  Not yet
                </button>
              </div>
            </div>
          ) : (
            <button type="button" className="btn-primary w-full" disabled={graded < items.length} onClick={() => setConfirming(true)} data-testid="submit-attempt">
              Submit
            </button>
          )}
          {graded < items.length && <p className="text-xs text-gauge-700">Submit opens once every item has a grade.</p>}
        </div>
      </div>
    </div>
  );
}
