/** A labelled progress bar (0–100) that assistive technology announces as one. */
export function ProgressBar({ label, value, tone = "normal" }: { label: string; value: number; tone?: "normal" | "ok" | "fault" }) {
  const clamped = Math.max(0, Math.min(100, Math.round(value)));
  const fill = tone === "fault" ? "bg-fault-600" : tone === "ok" ? "bg-ok-600" : "bg-gauge-600";
  return (
    <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={clamped} className="h-2 w-full overflow-hidden rounded-full bg-gauge-100">
      <div className={`h-full rounded-full transition-[width] duration-200 ${fill}`} style={{ width: `${clamped}%` }} />
    </div>
  );
}
