"use client";

import Link from "next/link";

export default function GalleryItemError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="card max-w-xl space-y-3 p-6">
      <h1 className="text-lg font-semibold">This gallery item could not be shown</h1>
      <p className="text-sm text-gauge-700">
        Something went wrong while loading it; nothing was changed. Try again; if it keeps happening, tell your QC lead
        {error.digest ? ` and quote reference ${error.digest}` : ""}.
      </p>
      <div className="flex gap-2">
        <button type="button" className="btn-primary" onClick={reset}>
          Try again
        </button>
        <Link href="/gallery" className="btn-secondary">
          Back to the Gallery
        </Link>
      </div>
    </div>
  );
}
