"use client";

export default function SignedInError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="card max-w-xl space-y-3 p-6">
      <h1 className="text-lg font-semibold">This page could not be shown</h1>
      <p className="text-sm text-gauge-700">
        Something went wrong while loading it. Nothing you saved is lost. Try again; if it keeps happening, tell your QC lead
        {error.digest ? ` and quote reference ${error.digest}` : ""}.
      </p>
      <button type="button" className="btn-primary" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
