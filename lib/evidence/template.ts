/**
 * The e-mail a lead sends a supplier with an evidence pack: an editable template with named
 * placeholders, filled from the lot's report data. Pure: plain data in, text out.
 *
 * Decisions:
 * - Placeholders are `{{name}}` from a fixed list (EVIDENCE_PLACEHOLDERS). An unknown name or a
 *   brace left open is an error the lead sees before anything is sent, never text passed through
 *   to the supplier as "{{lot}" or silently dropped.
 * - The values are plain text (the e-mail goes as text; the HTML part escapes it). Figures come
 *   from the lot's decision (the counts it rested on), not a recount.
 * - Limits: subject 200 characters, body 5 000 (a supplier reads the attachments for the detail);
 *   checked on the template and again on the filled text, since a long reason can pass them.
 * - `{{files}}` says where the files are, which is known only once they are rendered: attached to
 *   the e-mail, or (over the size limit) on the evidence link's page, with the link. A template
 *   that leaves `{{files}}` out still gets the link, at the end, when the files go by link: the
 *   supplier must be able to reach them whatever the lead wrote.
 */
import { DEFECT_SEVERITIES, DEFECT_SEVERITY_LABELS } from "@/lib/part-types/severity";
import { DISPOSITION_LABELS } from "@/lib/lots/schemas";
import type { LotReportData } from "@/lib/reports/lot-report-data";

export const EVIDENCE_SUBJECT_MAX = 200;
export const EVIDENCE_BODY_MAX = 5000;

export const EVIDENCE_PLACEHOLDERS = {
  lot: "the lot's purchase reference",
  supplier: "the supplier's name",
  partType: "the part type",
  quantity: "units received",
  decision: "the verdict and disposition, e.g. “rejected — return to vendor”",
  plan: "the sampling plan: sample size and Ac/Re per severity",
  defectives: "defective units found per severity",
  reason: "the lead's reason recorded with the decision",
  claimRef: "the claim / RMA reference",
  files: "where the files are: attached, or (when too large to attach) the evidence link",
  workspace: "your workspace's name",
} as const;

export type EvidencePlaceholder = keyof typeof EVIDENCE_PLACEHOLDERS;
export type EvidenceValues = Record<EvidencePlaceholder, string>;

export const DEFAULT_EVIDENCE_SUBJECT = "Lot {{lot}}: {{decision}} (claim {{claimRef}})";

export const DEFAULT_EVIDENCE_BODY = `Hello,

we inspected lot {{lot}} ({{quantity}} × {{partType}}) on receipt and it was {{decision}}.

Sampling plan: {{plan}}
Defective units found: {{defectives}}

Reason: {{reason}}

Please quote claim {{claimRef}} in your reply. {{files}}

Regards,
{{workspace}}`;

/** How the files reach the supplier: attached to the e-mail, or on the evidence link's page (expiry as the reader's local time). */
export type FilesDelivery = { kind: "attached" } | { kind: "link"; url: string; files: number; totalBytes: number; expiresAt: string };

const WHAT_IS_SENT = "The lot inspection report (PDF), the photos of the defective units with their defects marked, and a table of the sampled units";

/** The `{{files}}` sentence: true to the way the files are sent. */
export function filesSentence(delivery: FilesDelivery): string {
  if (delivery.kind === "attached") return `${WHAT_IS_SENT} are attached.`;
  const mb = (delivery.totalBytes / 1048576).toFixed(1);
  return `${WHAT_IS_SENT} (${delivery.files} files, ${mb} MB) are too large to attach; they are on a read-only page you can open until ${delivery.expiresAt}:\n${delivery.url}`;
}

/** The values of the placeholders for a decided lot. */
export function evidenceValues(report: LotReportData, claimRef: string, delivery: FilesDelivery): EvidenceValues {
  const decision = report.decision;
  const verdict = decision?.verdict === "reject" ? "rejected" : decision?.verdict === "accept" ? "accepted" : "not decided";
  const disposition = decision?.disposition ? ` — ${DISPOSITION_LABELS[decision.disposition].toLowerCase()}` : "";
  const plan = DEFECT_SEVERITIES.map((s) => {
    const row = report.plan[s];
    return `${DEFECT_SEVERITY_LABELS[s].toLowerCase()} ${row.sampleSize} units, Ac ${row.accept} / Re ${row.reject}`;
  }).join("; ");
  const defectives = DEFECT_SEVERITIES.map((s) => `${DEFECT_SEVERITY_LABELS[s].toLowerCase()} ${report.plan[s].found} of ${report.plan[s].inspected}`).join("; ");
  return {
    lot: report.lot.purchaseRef,
    supplier: report.lot.supplierName,
    partType: report.lot.partTypeName,
    quantity: String(report.lot.quantity),
    decision: `${verdict}${disposition}`,
    plan,
    defectives,
    reason: decision?.reason?.trim() || "—",
    claimRef,
    files: filesSentence(delivery),
    workspace: report.workspaceName,
  };
}

export type TemplateProblem = { kind: "unknown"; name: string } | { kind: "unclosed"; at: number };

/** Names used, and what is wrong, in a template (no values needed). */
export function checkTemplate(template: string): { used: EvidencePlaceholder[]; problems: TemplateProblem[] } {
  const used = new Set<EvidencePlaceholder>();
  const problems: TemplateProblem[] = [];
  let i = 0;
  for (;;) {
    const open = template.indexOf("{{", i);
    if (open < 0) break;
    const close = template.indexOf("}}", open + 2);
    const nextOpen = template.indexOf("{{", open + 2);
    if (close < 0 || (nextOpen >= 0 && nextOpen < close)) {
      problems.push({ kind: "unclosed", at: open });
      i = open + 2;
      continue;
    }
    const name = template.slice(open + 2, close).trim();
    if (Object.hasOwn(EVIDENCE_PLACEHOLDERS, name)) used.add(name as EvidencePlaceholder);
    else problems.push({ kind: "unknown", name });
    i = close + 2;
  }
  return { used: [...used], problems };
}

/** A sentence for the first problem, or null when the template is fine. */
export function templateProblemMessage(what: "subject" | "body", template: string): string | null {
  const [problem] = checkTemplate(template).problems;
  if (!problem) return null;
  const known = Object.keys(EVIDENCE_PLACEHOLDERS)
    .map((n) => `{{${n}}}`)
    .join(", ");
  if (problem.kind === "unclosed") return `The ${what} has a "{{" without its closing "}}" (at character ${problem.at + 1}).`;
  return `The ${what} names {{${problem.name}}}, which is not a placeholder. Use one of ${known}.`;
}

/** Fills a template that checkTemplate found fine (throws otherwise: callers check first). */
export function fillTemplate(template: string, values: EvidenceValues): string {
  if (checkTemplate(template).problems.length) throw new RangeError("fillTemplate: the template has problems; check it first");
  return template.replace(/\{\{([^{}]*)\}\}/g, (_, name: string) => values[name.trim() as EvidencePlaceholder]);
}

/** The e-mail's text: the body filled in; files sent by link whose body leaves out {{files}} get the link sentence at the end. */
export function evidenceText(body: string, values: EvidenceValues, delivery: FilesDelivery): string {
  const text = fillTemplate(body, values);
  if (delivery.kind === "attached" || checkTemplate(body).used.includes("files")) return text;
  return `${text.trimEnd()}\n\n${values.files}`;
}
