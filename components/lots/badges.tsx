import { DEFECT_SEVERITY_LABELS, type DefectSeverity } from "@/lib/part-types/severity";

const tone = {
  ok: "bg-ok-50 text-ok-600 ring-ok-600/30",
  fault: "bg-fault-50 text-fault-700 ring-fault-600/30",
  signal: "bg-signal-50 text-signal-700 ring-signal-500/30",
  neutral: "bg-gauge-50 text-gauge-700 ring-gauge-300",
} as const;

export function Badge({ kind, children, testId }: { kind: keyof typeof tone; children: React.ReactNode; testId?: string }) {
  return (
    <span data-testid={testId} className={`inline-flex items-center whitespace-nowrap rounded px-1.5 py-0.5 text-xs font-medium ring-1 ring-inset ${tone[kind]}`}>
      {children}
    </span>
  );
}

export function VerdictBadge({ verdict, testId }: { verdict: "accept" | "reject" | "pending"; testId?: string }) {
  const kind = verdict === "accept" ? "ok" : verdict === "reject" ? "fault" : "neutral";
  return (
    <Badge kind={kind} testId={testId}>
      {verdict === "accept" ? "Accept" : verdict === "reject" ? "Reject" : "Pending"}
    </Badge>
  );
}

export function InspectionSeverityBadge({ severity }: { severity: "normal" | "tightened" | "reduced" }) {
  return <Badge kind={severity === "tightened" ? "signal" : "neutral"}>{severity[0].toUpperCase() + severity.slice(1)}</Badge>;
}

export function DefectSeverityBadge({ severity }: { severity: DefectSeverity }) {
  return <Badge kind={severity === "critical" ? "fault" : severity === "major" ? "signal" : "neutral"}>{DEFECT_SEVERITY_LABELS[severity]}</Badge>;
}
