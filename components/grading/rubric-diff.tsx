"use client";

import { useMemo, useState } from "react";
import { diffRubrics } from "@/lib/grading/diff";
import type { PartTypeSummary, RubricVersionView } from "./types";

const KIND_STYLE = { added: "text-ok-600", removed: "text-fault-700", changed: "text-signal-700", notes: "text-gauge-700" } as const;
const KIND_MARK = { added: "+", removed: "−", changed: "~", notes: "•" } as const;

/** A readable difference between any two versions, one sentence per change (lib/grading/diff). */
export function RubricDiff({ versions, partType, defaultTo }: { versions: RubricVersionView[]; partType: PartTypeSummary; defaultTo: number | null }) {
  const newest = defaultTo ?? versions[0]?.version ?? null;
  const base = versions.find((v) => v.version === newest);
  const [to, setTo] = useState<number | null>(newest);
  const [from, setFrom] = useState<number | null>(
    base?.basedOnVersion ?? versions.find((v) => newest !== null && v.version < newest)?.version ?? versions.find((v) => v.version !== newest)?.version ?? newest,
  );
  const diff = useMemo(() => {
    const before = versions.find((v) => v.version === from);
    const after = versions.find((v) => v.version === to);
    return before && after ? diffRubrics(before.rubric, after.rubric, partType.labels) : null;
  }, [versions, from, to, partType.labels]);

  if (versions.length < 2) return <p className="text-sm text-gauge-700">There is only one version, so there is nothing to compare yet.</p>;
  const label = (v: RubricVersionView) => `Version ${v.version}${v.status === "draft" ? " (draft)" : ""}`;
  return (
    <div className="space-y-3" data-testid="rubric-diff">
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="diff-from" className="field-label">
            From
          </label>
          <select id="diff-from" className="field-input" value={from ?? ""} onChange={(e) => setFrom(Number(e.target.value))}>
            {versions.map((v) => (
              <option key={v.version} value={v.version}>
                {label(v)}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="diff-to" className="field-label">
            To
          </label>
          <select id="diff-to" className="field-input" value={to ?? ""} onChange={(e) => setTo(Number(e.target.value))}>
            {versions.map((v) => (
              <option key={v.version} value={v.version}>
                {label(v)}
              </option>
            ))}
          </select>
        </div>
      </div>
      {diff &&
        (diff.unchanged ? (
          <p className="text-sm text-gauge-700">No differences: both versions have the same rules and notes.</p>
        ) : (
          <ul className="space-y-1 text-sm" data-testid="rubric-diff-changes">
            {diff.changes.map((change, i) => (
              <li key={i} className="flex gap-2">
                <span className={`w-4 shrink-0 text-center font-bold ${KIND_STYLE[change.kind]}`} aria-label={change.kind}>
                  {KIND_MARK[change.kind]}
                </span>
                <span className="min-w-0 break-words">{change.text}</span>
              </li>
            ))}
          </ul>
        ))}
    </div>
  );
}
