import type { Grade } from "@/lib/grading/rubric-schema";

// Our own grade colours: green A, frame blue-green B, amber C, red Reject.
const STYLE: Record<Grade, string> = {
  A: "border-ok-600 bg-ok-50 text-ok-600",
  B: "border-gauge-400 bg-gauge-100 text-gauge-800",
  C: "border-signal-500 bg-signal-100 text-signal-700",
  Reject: "border-fault-600 bg-fault-50 text-fault-700",
};

/** A grade as a compact, colour-coded label (the text carries the meaning, colour only helps). */
export function GradeBadge({ grade, size = "md", testId }: { grade: Grade; size?: "sm" | "md" | "lg"; testId?: string }) {
  const sizing = size === "lg" ? "px-3 py-1 text-lg" : size === "sm" ? "px-1.5 py-0 text-xs" : "px-2 py-0.5 text-sm";
  return (
    <span className={`inline-flex items-center rounded-md border font-semibold ${sizing} ${STYLE[grade]}`} data-testid={testId}>
      {grade}
    </span>
  );
}
