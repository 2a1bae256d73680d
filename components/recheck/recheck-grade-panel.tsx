"use client";

import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { GradeBadge } from "@/components/grading/grade-badge";
import { FormMessage } from "@/components/ui/form-field";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { apiFetch } from "@/lib/http/client";
import type { RecheckComparison } from "@/lib/recheck/compare";
import { recheckUrls, type Proposal } from "./api";

type Outcome = { status: "agreed" | "adjudication"; notBlind: boolean; recheckGrade: Grade; comparison: RecheckComparison; reasons: { kind: string }[] };

const percent = (value: number) => (Number.isFinite(value) ? `${Math.round(value * 100)} %` : "n/a");

/**
 * Measure the auditor's own regions under the first grade's rubric version, then accept the
 * proposal or override it with a reason. After submitting, the comparison with the first grade
 * is shown (only then).
 */
export function RecheckGradePanel({ recheckId, beforeMeasure, onSubmitted }: { recheckId: string; beforeMeasure: () => Promise<boolean>; onSubmitted: () => void }) {
  const [override, setOverride] = useState<Grade | "">("");
  const [reason, setReason] = useState("");
  const measure = useMutation({
    mutationFn: async () => {
      if (!(await beforeMeasure())) throw new Error("Your latest marks are not saved yet; wait for the save, then measure.");
      return apiFetch<Proposal>(recheckUrls.measure(recheckId), { method: "POST" });
    },
  });
  const submit = useMutation({
    mutationFn: (proposed: Grade) =>
      apiFetch<{ recheck: Outcome }>(recheckUrls.submission(recheckId), {
        body: override ? { decision: "override", proposedGrade: proposed, finalGrade: override, reason } : { decision: "accept", proposedGrade: proposed },
      }),
    onSuccess: () => onSubmitted(),
  });
  const proposal = measure.data?.proposal;

  if (submit.data) {
    const outcome = submit.data.recheck;
    return (
      <section className="space-y-2 rounded-md border border-gauge-200 p-3" aria-label="Recheck outcome" data-testid="recheck-outcome">
        <h2 className="text-base font-semibold">{outcome.status === "agreed" ? "Submitted: the two grades agree" : "Submitted: sent to adjudication"}</h2>
        <p className="flex items-center gap-2 text-sm">
          First grade <GradeBadge grade={outcome.comparison.grade.first} size="sm" /> · yours <GradeBadge grade={outcome.recheckGrade} size="sm" />
        </p>
        {outcome.notBlind && <p className="text-sm text-signal-700">You had opened this unit&apos;s inspection work before, so this recheck is marked not blind and the scorecards leave it out.</p>}
        <table className="w-full text-sm">
          <caption className="text-left text-gauge-700">Overlap per defect class (pixels inside the Surface)</caption>
          <thead>
            <tr className="text-left">
              <th scope="col">Class</th>
              <th scope="col">IoU</th>
              <th scope="col">Dice</th>
              <th scope="col">Matched / only first / only yours</th>
            </tr>
          </thead>
          <tbody>
            {Object.entries(outcome.comparison.classes).map(([defect, c]) => (
              <tr key={defect}>
                <th scope="row" className="font-normal">
                  {defect}
                </th>
                <td>{percent(c.iou)}</td>
                <td>{percent(c.dice)}</td>
                <td>
                  {c.matched} / {c.onlyFirst} / {c.onlyRecheck}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <Link className="btn-primary inline-flex h-8 items-center py-0 text-sm" href="/recheck">
          Back to the recheck queue
        </Link>
      </section>
    );
  }

  return (
    <section className="space-y-2 rounded-md border border-gauge-200 p-3" aria-label="Your measurement and grade" data-testid="recheck-grade-panel">
      <h2 className="text-base font-semibold">Your measurement and grade</h2>
      <button type="button" className="btn-secondary h-8 py-0 text-sm" onClick={() => measure.mutate()} disabled={measure.isPending}>
        {measure.isPending ? "Measuring…" : proposal ? "Measure again" : "Measure"}
      </button>
      {measure.isError && <FormMessage kind="error">{measure.error.message}</FormMessage>}
      {proposal && (
        <>
          <p className="flex items-center gap-2 text-sm">
            Proposed under rubric version {measure.data!.rubricVersion}: <GradeBadge grade={proposal.grade} testId="recheck-proposal" />
          </p>
          {proposal.lines.length > 0 && (
            <ul className="list-disc pl-5 text-sm text-gauge-800">
              {proposal.lines.map((line, i) => (
                <li key={i}>{line.text}</li>
              ))}
            </ul>
          )}
          <form
            className="space-y-2"
            onSubmit={(event) => {
              event.preventDefault();
              submit.mutate(proposal.grade);
            }}
          >
            <label className="block text-sm">
              <span className="font-medium">Your grade</span>
              <select className="input mt-1" value={override} onChange={(e) => setOverride(e.target.value as Grade | "")}>
                <option value="">Accept the proposal ({proposal.grade})</option>
                {GRADES.filter((g) => g !== proposal.grade).map((g) => (
                  <option key={g} value={g}>
                    Override: {g}
                  </option>
                ))}
              </select>
            </label>
            {override && (
              <label className="block text-sm">
                <span className="font-medium">Why the proposal is wrong</span>
                <textarea className="input mt-1" rows={2} value={reason} onChange={(e) => setReason(e.target.value)} required maxLength={1000} />
              </label>
            )}
            {submit.isError && <FormMessage kind="error">{submit.error.message}</FormMessage>}
            <button type="submit" className="btn-primary h-8 py-0 text-sm" disabled={submit.isPending}>
              Submit my grade
            </button>
          </form>
        </>
      )}
    </section>
  );
}
