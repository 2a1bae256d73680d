/** Says which parts of a list's link were left out (bad or unknown values), naming them as the screen does. */
export function IgnoredParamsNote({ ignored, labels }: { ignored: readonly string[]; labels: Record<string, string> }) {
  if (ignored.length === 0) return null;
  const names = [...new Set(ignored.map((key) => labels[key] ?? `“${key}”`))];
  return (
    <p role="status" className="rounded-md bg-signal-50 px-3 py-2 text-sm text-signal-700" data-testid="ignored-params">
      Part of this link could not be used and is left out: {names.join(", ")}. The list shows {names.length === 1 ? "its default" : "their defaults"} instead.
    </p>
  );
}
