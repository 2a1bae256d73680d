"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useTransition } from "react";

/**
 * A detail segment's error.tsx: the shell and navigation stay, the page says what failed and
 * offers Try again (which asks the server again: `reset` alone would only re-render what the
 * browser already has) and the way back to its list.
 */
export function SegmentError({ error, reset, what, backHref, backLabel }: { error: Error & { digest?: string }; reset: () => void; what: string; backHref: string; backLabel: string }) {
  const router = useRouter();
  const [retrying, startRetry] = useTransition();
  return (
    <div role="alert" className="card max-w-xl space-y-3 p-6" data-testid="segment-error">
      <h1 className="text-lg font-semibold">This {what} could not be shown</h1>
      <p className="text-sm text-gauge-700">
        Something went wrong while loading it. Nothing you saved is lost. Try again; if it keeps happening, tell your QC lead
        {error.digest ? ` and quote reference ${error.digest}` : ""}.
      </p>
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn-primary"
          disabled={retrying}
          onClick={() =>
            startRetry(() => {
              router.refresh();
              reset();
            })
          }
        >
          {retrying ? "Trying again…" : "Try again"}
        </button>
        <Link href={backHref} className="btn-secondary">
          {backLabel}
        </Link>
      </div>
    </div>
  );
}
