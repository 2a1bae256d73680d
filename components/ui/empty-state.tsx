import Link from "next/link";
import type { SetupStep } from "@/lib/workspace/setup";

/**
 * What an empty screen says: why it is empty and the steps that fill it, each with a link (done
 * ones ticked). Used by the home page's getting-started list and the empty screens.
 */
export function EmptyState({ title, children, steps = [], testId = "empty-state" }: { title: string; children?: React.ReactNode; steps?: readonly SetupStep[]; testId?: string }) {
  return (
    <section className="card space-y-3 border-dashed p-5" aria-label={title} data-testid={testId}>
      <h2 className="text-lg font-semibold">{title}</h2>
      {children && <div className="text-sm text-gauge-700">{children}</div>}
      {steps.length > 0 && (
        <ol className="space-y-2">
          {steps.map((step, i) => (
            <li key={step.key} className="flex gap-3 text-sm" data-testid={`setup-step-${step.key}`} data-done={step.done}>
              <span
                aria-hidden
                className={`flex h-6 w-6 shrink-0 items-center justify-center rounded-full text-xs font-semibold ${step.done ? "bg-ok-50 text-ok-600" : "bg-gauge-100 text-gauge-700"}`}
              >
                {step.done ? "✓" : i + 1}
              </span>
              <div>
                <span className="font-medium">{step.title}</span>
                {step.done && <span className="sr-only"> (done)</span>}: {step.detail}{" "}
                {!step.done && (
                  <Link href={step.href} className="font-medium text-gauge-700 underline">
                    {step.action}
                  </Link>
                )}
              </div>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
