import Form from "next/form";
import { groupedHash } from "@/lib/reports/certificate-content";
import type { VerificationAnswer } from "@/lib/certificates/verification";

/**
 * What the public verification page shows: the certificate's facts and their hash, or one plain
 * sentence. Nothing links into the workspace (no unit, lot or supplier pages, no names of people).
 */
export function VerificationView({ answer }: { answer: VerificationAnswer }) {
  if (!answer.ok) {
    return (
      <section className="space-y-2" data-testid="verification-refused" data-reason={answer.reason}>
        <h1 className="text-xl font-semibold">{answer.reason === "revoked" ? "Certificate revoked" : "Certificate not verified"}</h1>
        <p className="text-gauge-800">{answer.message}</p>
      </section>
    );
  }
  const c = answer.content;
  const facts: [string, string][] = [
    ["Issued by", c.workspace],
    ["Issued", c.issuedAt.replace("T", " ").replace(/\.\d+Z$/, " UTC")],
    ["Part type", c.partType],
    ["Device model family", c.modelFamily || "—"],
    ["Serial", c.serial],
    ["Rubric", `${c.rubric.name}, version ${c.rubric.version}`],
  ];
  return (
    <article className="space-y-4" data-testid="verification-ok">
      <div>
        <p className="text-xs font-medium uppercase tracking-wide text-ok-600">Valid certificate</p>
        <h1 className="text-xl font-semibold">
          Condition certificate {c.shortCode} · grade <span data-testid="verified-grade">{c.grade}</span>
        </h1>
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        {facts.map(([term, value]) => (
          <div key={term} className="contents">
            <dt className="font-medium text-gauge-700">{term}</dt>
            <dd>{value}</dd>
          </div>
        ))}
      </dl>
      {c.explanation.length > 0 && (
        <section>
          <h2 className="text-sm font-semibold">Why this grade</h2>
          <ul className="list-disc pl-5 text-sm">
            {c.explanation.map((line, i) => (
              <li key={i}>{line}</li>
            ))}
          </ul>
        </section>
      )}
      <section>
        <h2 className="text-sm font-semibold">Functional checks</h2>
        {c.checklist.length === 0 && <p className="text-sm text-gauge-700">This part type has no functional checks.</p>}
        <ul className="text-sm">
          {c.checklist.map((item, i) => (
            <li key={i}>
              {item.label}: {item.result}
              {item.detail ? ` (${item.detail})` : ""}
            </li>
          ))}
        </ul>
      </section>
      <section>
        <h2 className="text-sm font-semibold">Photos it was graded on (SHA-256)</h2>
        <ul className="break-all font-mono text-xs">
          {c.views.map((v, i) => (
            <li key={i}>
              {v.label}: {v.photoSha256}
            </li>
          ))}
        </ul>
      </section>
      <section className="rounded-md bg-gauge-50 p-3">
        <h2 className="text-sm font-semibold">Content hash (SHA-256)</h2>
        <p className="break-all font-mono text-sm" data-testid="verified-hash">
          {groupedHash(answer.contentHash)}
        </p>
        <p className="mt-1 text-xs text-gauge-600">It must match the hash printed on the certificate you hold.</p>
      </section>
      <p className="text-xs text-gauge-600">Grades are decision aids: company policy, supplier contracts and local regulations decide.</p>
    </article>
  );
}

/** The short-code form (a GET form, so the code is in the address and works without script). */
export function CodeForm({ code }: { code?: string }) {
  return (
    <Form action="/verify" className="space-y-2" aria-label="Check a certificate code">
      <label className="block">
        <span className="field-label">Certificate code</span>
        <input name="code" className="field-input font-mono uppercase" defaultValue={code ?? ""} maxLength={40} placeholder="XXXX-XXXX-XXX" autoComplete="off" />
      </label>
      <button type="submit" className="btn-primary w-full">
        Check
      </button>
    </Form>
  );
}
