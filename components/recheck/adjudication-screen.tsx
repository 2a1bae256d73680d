"use client";

import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { GradeBadge } from "@/components/grading/grade-badge";
import type { MeasurementLabels } from "@/components/grading/measurement-table";
import { FormMessage } from "@/components/ui/form-field";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { adjudicationReasonsText } from "@/lib/recheck/adjudication";
import { apiFetch } from "@/lib/http/client";
import { recheckUrls, type AdjudicationJson } from "./api";
import { OVERLAY_KEY, OverlayOnPhoto, RegionsOnPhoto } from "./side-svg";

/** A label inside a sentence: "Dust under glass" reads "dust under glass"; "LCD bleed" stays. */
const midSentence = (label: (key: string) => string) => (key: string) => {
  const text = label(key);
  return /^[A-Z][a-z]/.test(text) ? text[0].toLowerCase() + text.slice(1) : text;
};

const percent = (value: number) => (Number.isFinite(value) ? `${Math.round(value * 100)} %` : "n/a");

function Side({ title, side }: { title: string; side: AdjudicationJson["first"] }) {
  return (
    <section className="space-y-1 rounded-md border border-gauge-200 p-3" aria-label={title}>
      <h2 className="flex items-center gap-2 text-base font-semibold">
        {title}: <GradeBadge grade={side.grade as Grade} />
      </h2>
      <p className="text-sm text-gauge-700">
        By {side.byName ?? "someone no longer listed"} · proposed {side.proposed}
        {side.overrideReason ? ` · overridden: “${side.overrideReason}”` : ""}
      </p>
      {side.lines.length > 0 && (
        <ul className="list-disc pl-5 text-sm">
          {side.lines.map((line, i) => (
            <li key={i}>{line.text}</li>
          ))}
        </ul>
      )}
    </section>
  );
}

/**
 * A disagreement side by side (first grade, recheck), then overlaid, with the measurements'
 * explanation lines and the overlap per class; the adjudicator decides which grade stands, or
 * gives their own, always with a reason.
 */
export function AdjudicationScreen({ view, labels }: { view: AdjudicationJson; labels: MeasurementLabels }) {
  const defectLabel = (key: string) => labels.defects[key] ?? key;
  const viewLabel = (key: string) => labels.views[key] ?? key;
  const [choice, setChoice] = useState<"first" | "recheck" | "own">("first");
  const [own, setOwn] = useState<Grade>("A");
  const [reason, setReason] = useState("");
  const decide = useMutation({
    mutationFn: () =>
      apiFetch<{ adjudication: { finalGrade: Grade; decidedLotAffected: boolean } }>(recheckUrls.adjudication(view.recheck.id), {
        body: choice === "own" ? { choice, finalGrade: own, reason } : { choice, reason },
      }),
  });
  const settled = view.recheck.adjudication;
  return (
    <div className="space-y-4" data-testid="adjudication">
      <header>
        <h1 className="text-xl font-semibold">
          Settle a disagreement · {view.unit.partTypeName} {view.unit.serial ?? ""}
        </h1>
        <p className="text-sm text-gauge-700">
          Lot <a href={`/lots/${view.unit.lotId}`}>{view.unit.purchaseRef}</a> · rubric version {view.unit.rubricVersion} · why:{" "}
          {adjudicationReasonsText(view.recheck.reasons, midSentence(defectLabel))}
        </p>
      </header>
      <div className="grid gap-3 md:grid-cols-2">
        <Side title="First grade" side={view.first} />
        <Side title="Recheck" side={view.second} />
      </div>
      {view.photos.map((p) => (
        <section key={p.photo.id} className="space-y-2" aria-label={`The ${viewLabel(p.photo.viewKey)} photo`}>
          <h2 className="text-base font-semibold">Photo: {viewLabel(p.photo.viewKey)}</h2>
          <div className="grid gap-3 lg:grid-cols-3">
            <figure>
              <RegionsOnPhoto photoId={p.photo.id} width={p.photo.width} height={p.photo.height} regions={p.first} label="The first grade's regions" />
              <figcaption className="text-sm text-gauge-700">First grade&apos;s regions ({p.first.length})</figcaption>
            </figure>
            <figure>
              <RegionsOnPhoto photoId={p.photo.id} width={p.photo.width} height={p.photo.height} regions={p.recheck} label="The recheck's regions" />
              <figcaption className="text-sm text-gauge-700">Recheck&apos;s regions ({p.recheck.length})</figcaption>
            </figure>
            <figure>
              <OverlayOnPhoto
                photoId={p.photo.id}
                width={p.photo.width}
                height={p.photo.height}
                areas={p.comparison?.areas ?? {}}
                label="Both overlaid: hatched only first, dotted only recheck, pale both"
              />
              <figcaption className="text-sm text-gauge-700">Overlaid</figcaption>
            </figure>
          </div>
        </section>
      ))}
      <ul className="flex flex-wrap gap-4 text-sm" aria-label="Overlay key">
        {OVERLAY_KEY.map((key) => (
          <li key={key.kind} className="flex items-center gap-2">
            <span className={`inline-block h-4 w-6 rounded-sm ${key.swatch}`} aria-hidden="true" /> {key.label}
          </li>
        ))}
      </ul>
      <table className="text-sm">
        <caption className="text-left font-semibold">Overlap per defect class (whole unit)</caption>
        <thead>
          <tr className="text-left">
            <th scope="col" className="pr-4">
              Class
            </th>
            <th scope="col" className="pr-4">
              First px
            </th>
            <th scope="col" className="pr-4">
              Recheck px
            </th>
            <th scope="col" className="pr-4">
              IoU
            </th>
            <th scope="col">Dice</th>
          </tr>
        </thead>
        <tbody>
          {Object.entries(view.classes).map(([defect, c]) => (
            <tr key={defect}>
              <th scope="row" className="pr-4 font-normal">
                {defectLabel(defect)}
              </th>
              <td className="pr-4">{c.firstPx}</td>
              <td className="pr-4">{c.recheckPx}</td>
              <td className="pr-4">{percent(c.iou)}</td>
              <td>{percent(c.dice)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {settled || decide.data ? (
        <p role="status" className="rounded-md border border-gauge-300 bg-gauge-50 p-3 text-sm" data-testid="adjudication-done">
          Settled: {decide.data ? `${decide.data.adjudication.finalGrade} is now the unit's grade.` : `${settled!.choice} stands (${settled!.reason}).`}
          {decide.data?.adjudication.decidedLotAffected && " The lot was already decided: nothing in it was changed; its lead is told on the lot page."}
        </p>
      ) : (
        <form
          className="max-w-xl space-y-2 rounded-md border border-gauge-200 p-3"
          onSubmit={(event) => {
            event.preventDefault();
            decide.mutate();
          }}
        >
          <fieldset className="space-y-1 text-sm">
            <legend className="font-semibold">Which grade stands?</legend>
            {(["first", "recheck", "own"] as const).map((c) => (
              <label key={c} className="flex items-center gap-2">
                <input type="radio" name="choice" value={c} checked={choice === c} onChange={() => setChoice(c)} />
                {c === "first" ? `The first grade (${view.first.grade})` : c === "recheck" ? `The recheck (${view.second.grade})` : "My own grade"}
              </label>
            ))}
          </fieldset>
          {choice === "own" && (
            <label className="block text-sm">
              <span className="font-medium">Grade</span>
              <select className="input mt-1" value={own} onChange={(e) => setOwn(e.target.value as Grade)}>
                {GRADES.map((g) => (
                  <option key={g}>{g}</option>
                ))}
              </select>
            </label>
          )}
          <label className="block text-sm">
            <span className="font-medium">Reason</span>
            <textarea className="input mt-1" rows={2} value={reason} onChange={(e) => setReason(e.target.value)} required maxLength={1000} />
          </label>
          {decide.isError && <FormMessage kind="error">{decide.error.message}</FormMessage>}
          <button type="submit" className="btn-primary h-8 py-0 text-sm" disabled={decide.isPending}>
            Record the decision
          </button>
        </form>
      )}
    </div>
  );
}
