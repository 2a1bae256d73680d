export default function Loading() {
  return (
    <div className="animate-pulse space-y-4" aria-busy="true" aria-live="polite">
      <span className="sr-only">Loading…</span>
      <div className="h-8 w-48 rounded bg-gauge-100" />
      <div className="h-32 rounded-lg bg-gauge-100" />
    </div>
  );
}
