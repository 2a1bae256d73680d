import type { FieldError, UseFormRegisterReturn } from "react-hook-form";

/** A labelled input whose error is announced and tied to it with aria-describedby. */
export function FormField({
  id,
  label,
  type = "text",
  registration,
  error,
  hint,
  autoComplete,
}: {
  id: string;
  label: string;
  type?: string;
  registration: UseFormRegisterReturn;
  error?: FieldError | { message?: string };
  hint?: string;
  autoComplete?: string;
}) {
  const describedBy = [error?.message ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <input id={id} type={type} className="field-input" autoComplete={autoComplete} aria-invalid={error?.message ? true : undefined} aria-describedby={describedBy} {...registration} />
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-gauge-600">
          {hint}
        </p>
      )}
      {error?.message && (
        <p id={`${id}-error`} className="field-error" aria-live="polite">
          {error.message}
        </p>
      )}
    </div>
  );
}

/** A form-level message (success or failure), announced politely. */
export function FormMessage({ kind, children }: { kind: "error" | "success"; children: React.ReactNode }) {
  return (
    <div role={kind === "error" ? "alert" : "status"} className={`rounded-md px-3 py-2 text-sm ${kind === "error" ? "bg-fault-50 text-fault-700" : "bg-ok-50 text-ok-600"}`}>
      {children}
    </div>
  );
}
