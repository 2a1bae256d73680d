import { SkeletonBar } from "@/components/ui/segment-states";

/** The Bench's frame while a unit loads: its header, the photo area and the side panels. */
export default function UnitLoading() {
  return (
    <div className="space-y-4" aria-busy="true" data-testid="bench-skeleton">
      <span className="sr-only" role="status">
        Loading the unit…
      </span>
      <div className="animate-pulse space-y-4" aria-hidden>
        <div className="flex flex-wrap items-center gap-3">
          <SkeletonBar className="h-7 w-64" />
          <SkeletonBar className="h-6 w-28" />
        </div>
        <div className="flex flex-col gap-6 xl:flex-row">
          <div className="min-w-0 flex-1 space-y-3">
            <div className="flex gap-2">
              {[0, 1, 2, 3].map((i) => (
                <SkeletonBar key={i} className="h-16 w-20" />
              ))}
            </div>
            <div className="h-[55vh] rounded-lg bg-gauge-100" />
          </div>
          <div className="w-full space-y-4 xl:w-[24rem]">
            <div className="card h-48 p-4" />
            <div className="card h-64 p-4" />
          </div>
        </div>
      </div>
    </div>
  );
}
