import type { GradeLine } from "@/lib/grading/evaluate";
import { GradeBadge } from "./grade-badge";

/** The explanation of a grade: one line per fired rule, then notes on rules that could not be read. */
export function GradeLines({ lines, notes = [], testId }: { lines: GradeLine[]; notes?: string[]; testId?: string }) {
  return (
    <div className="space-y-2" data-testid={testId}>
      <ul className="space-y-1">
        {lines.map((line, i) => (
          <li key={`${line.ruleId}-${i}`} className="flex items-start gap-2 text-sm">
            <GradeBadge grade={line.grade} size="sm" />
            <span className="min-w-0 break-words">{line.text}</span>
          </li>
        ))}
      </ul>
      {notes.length > 0 && (
        <details className="text-xs text-gauge-700">
          <summary className="cursor-pointer">
            {notes.length} note{notes.length === 1 ? "" : "s"} on rules that could not be evaluated
          </summary>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            {notes.map((note, i) => (
              <li key={i}>{note}</li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
