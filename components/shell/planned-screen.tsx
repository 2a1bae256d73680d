import type { Screen } from "@/lib/nav";

/** What a screen that later work fills will do; it says plainly that it does nothing yet. */
export function PlannedScreen({ screen, coming }: { screen: Screen; coming: string[] }) {
  return (
    <div className="max-w-3xl space-y-4" data-testid="planned-screen">
      <div>
        <h1 className="page-title">{screen.label}</h1>
        <p className="text-gauge-700">{screen.summary}</p>
      </div>
      <div className="card p-5">
        <p className="text-sm font-medium text-signal-700">Not available yet — this screen is planned and does nothing today.</p>
        <p className="mt-3 text-sm text-gauge-800">What it will let you do:</p>
        <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-gauge-800">
          {coming.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </div>
    </div>
  );
}
