/**
 * One stored learned-suggestion model on the Gallery's Suggestions panel: version, when, whether in
 * use, why it was or was not switched in, where its examples came from, and per class what it
 * learned from and how it did on held-out photos (lib/suggestions/model-figures.ts).
 */
import type { SuggestionModelDto } from "@/lib/suggestions/dto";
import { classRows, describeSources, formatDuration } from "@/lib/suggestions/model-figures";
import { formatInstant } from "@/lib/time/format";

const rate = (value: number) => value.toFixed(2);

export function SuggestionModelCard({ model, labels, timeZone }: { model: SuggestionModelDto; labels: Record<string, string>; timeZone: string }) {
  const rows = classRows(model, labels);
  return (
    <article className="card space-y-3 p-4" data-testid="suggestion-model" data-version={model.version} aria-labelledby={`model-${model.id}`}>
      <header className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <h2 id={`model-${model.id}`} className="text-base font-semibold">
          Model {model.version}
        </h2>
        {model.inUse ? (
          <span className="rounded-md border border-ok-600 px-1.5 text-xs font-medium text-ok-600" data-testid="model-in-use">
            In use
          </span>
        ) : (
          <span className="rounded-md border border-gauge-300 bg-gauge-100 px-1.5 text-xs font-medium text-gauge-700">Kept aside</span>
        )}
        <span className="text-sm text-gauge-700">
          Trained {formatInstant(model.createdAt, timeZone)} in {formatDuration(model.trainingMs)}
          {model.requestedBy ? " (asked for by a trainer)" : ""}
        </span>
      </header>
      <p className="text-sm text-gauge-800">{model.decision}</p>
      <p className="text-sm text-gauge-700">{describeSources(model)}</p>
      <div className="overflow-x-auto">
        <table className="w-full min-w-[40rem] text-sm" data-testid="model-classes">
          <caption className="sr-only">Per class: what model {model.version} learned from and its held-out figures</caption>
          <thead>
            <tr className="border-b border-gauge-200 text-left text-xs uppercase tracking-wide text-gauge-700">
              <th scope="col" className="py-1.5 pr-3 font-medium">
                Class
              </th>
              <th scope="col" className="py-1.5 pr-3 text-right font-medium">
                Learned from
              </th>
              <th scope="col" className="py-1.5 pr-3 text-right font-medium">
                Held-out regions
              </th>
              <th scope="col" className="py-1.5 pr-3 text-right font-medium">
                Recall
              </th>
              <th scope="col" className="py-1.5 pr-3 text-right font-medium">
                Precision
              </th>
              <th scope="col" className="py-1.5 font-medium">
                Suggested on the Bench
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.defect} className="border-b border-gauge-100 align-top" data-testid="model-class" data-defect={row.defect}>
                <th scope="row" className="py-1.5 pr-3 text-left font-medium">
                  {row.label}
                </th>
                <td className="py-1.5 pr-3 text-right tabular-nums">
                  {row.learnedRegions} regions on {row.learnedPhotos} photos
                </td>
                <td className="py-1.5 pr-3 text-right tabular-nums">{row.heldOut ? row.heldOut.accepted : 0}</td>
                <td className="py-1.5 pr-3 text-right tabular-nums" title={row.heldOut ? `${row.heldOut.hits} of ${row.heldOut.accepted} accepted regions found` : undefined}>
                  {row.heldOut && row.heldOut.accepted > 0 ? rate(row.heldOut.recall) : "–"}
                </td>
                <td className="py-1.5 pr-3 text-right tabular-nums" title={row.heldOut ? `${row.heldOut.hits} of ${row.heldOut.suggested} suggestions were right` : undefined}>
                  {row.heldOut && row.heldOut.suggested > 0 ? rate(row.heldOut.precision) : "–"}
                </td>
                <td className="py-1.5">
                  <span className={row.suggest ? "font-medium text-ok-600" : "text-gauge-800"}>{row.suggest ? "Yes" : "No"}</span>
                  <span className="block text-xs text-gauge-700">{row.reason}</span>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </article>
  );
}
