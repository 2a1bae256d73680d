import Link from "next/link";

/**
 * What a detail page shows for an id that leads nowhere: mistyped, deleted, or another
 * workspace's. The three are told apart to no one, on purpose (another workspace's row behaves
 * exactly like a missing one). Used by each detail segment's not-found.tsx.
 */
export function DetailNotFound({ what, backHref, backLabel }: { what: string; backHref: string; backLabel: string }) {
  return (
    <div className="card max-w-xl space-y-3 p-6" data-testid="detail-not-found">
      <p className="text-sm font-medium uppercase tracking-wide text-gauge-500">Not found</p>
      <h1 className="page-title">No such {what}</h1>
      <p className="text-gauge-700">The link may be mistyped or out of date, or the {what} belongs to another workspace. Nothing has changed.</p>
      <Link href={backHref} className="btn-primary inline-block">
        {backLabel}
      </Link>
    </div>
  );
}

/** A grey bar of a skeleton (heights and widths as Tailwind classes). */
export function SkeletonBar({ className }: { className: string }) {
  return <div className={`rounded bg-gauge-100 ${className}`} />;
}

/**
 * The frame of a detail page while it loads (loading.tsx): a title and the cards below it, so the
 * page does not jump when the content arrives. `label` is announced to screen readers.
 */
export function DetailSkeleton({ label, cards = [24, 40, 32], maxWidth = "max-w-6xl" }: { label: string; cards?: number[]; maxWidth?: string }) {
  return (
    <div className={`${maxWidth} space-y-6`} aria-busy="true" data-testid="detail-skeleton">
      <span className="sr-only" role="status">
        {label}
      </span>
      <div className="animate-pulse space-y-6" aria-hidden>
        <SkeletonBar className="h-4 w-20" />
        <div className="space-y-2">
          <SkeletonBar className="h-8 w-72" />
          <SkeletonBar className="h-4 w-[28rem] max-w-full" />
        </div>
        {cards.map((height, i) => (
          <div key={i} className="card space-y-3 p-5">
            <SkeletonBar className="h-5 w-48" />
            <div className="rounded bg-gauge-50" style={{ height: `${height * 0.25}rem` }} />
          </div>
        ))}
      </div>
    </div>
  );
}
