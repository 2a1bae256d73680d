/** While a gallery item loads: the shape of its page (photo beside the details), so nothing jumps. */
export default function Loading() {
  return (
    <div className="animate-pulse space-y-4" aria-busy="true" aria-live="polite">
      <span className="sr-only">Loading the gallery item…</span>
      <div className="h-8 w-64 rounded bg-gauge-100" />
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="h-[60vh] min-h-[320px] rounded-lg bg-gauge-200" />
        <div className="space-y-3">
          <div className="h-24 rounded-lg bg-gauge-100" />
          <div className="h-40 rounded-lg bg-gauge-100" />
        </div>
      </div>
    </div>
  );
}
