import type { EvidenceLinkAnswer } from "@/lib/evidence/evidence-link";
import { formatInstant } from "@/lib/reports/format";
import { formatBytes } from "./types";

/**
 * The public evidence page (signed out): the one pack the link names — who sent it, the message,
 * its files to download — or one plain sentence. Nothing links into the workspace.
 */
export function EvidenceLinkView({ answer }: { answer: EvidenceLinkAnswer }) {
  if (!answer.ok) {
    return (
      <section className="space-y-2" data-testid="evidence-link-refused" data-reason={answer.reason}>
        <h1 className="text-xl font-semibold">{answer.reason === "revoked" ? "Evidence withdrawn" : "Evidence not available"}</h1>
        <p className="text-gauge-800">{answer.message}</p>
      </section>
    );
  }
  const { pack, token } = answer;
  const total = pack.attachments.reduce((sum, a) => sum + a.bytes, 0);
  return (
    <article className="space-y-4" data-testid="evidence-link-ok">
      <div>
        <p className="text-xs font-medium uppercase tracking-wide text-gauge-600">Evidence pack · claim {pack.claimReference}</p>
        <h1 className="text-xl font-semibold">{pack.subject}</h1>
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-medium text-gauge-700">From</dt>
        <dd>{pack.workspaceName}</dd>
        <dt className="font-medium text-gauge-700">Lot</dt>
        <dd>{pack.purchaseRef}</dd>
        <dt className="font-medium text-gauge-700">Sent</dt>
        <dd>{formatInstant(pack.createdAt)}</dd>
        <dt className="font-medium text-gauge-700">Open until</dt>
        <dd>{pack.linkExpiresAt ? formatInstant(pack.linkExpiresAt) : "—"}</dd>
      </dl>
      <pre className="whitespace-pre-wrap wrap-anywhere rounded-md bg-gauge-50 p-3 font-sans text-sm">{pack.body}</pre>
      <section>
        <h2 className="text-sm font-semibold">
          Files ({pack.attachments.length}, {formatBytes(total)})
        </h2>
        <ul className="mt-1 space-y-1 text-sm wrap-anywhere">
          {pack.attachments.map((file, index) => (
            <li key={index}>
              <a className="underline" href={`/api/evidence-links/${encodeURIComponent(token)}?file=${index}`} download={file.filename}>
                {file.filename}
              </a>{" "}
              <span className="text-gauge-600">({formatBytes(file.bytes)})</span>
            </li>
          ))}
        </ul>
      </section>
      <p className="text-xs text-gauge-600">This page shows one evidence pack, read-only. The sender can withdraw it at any time.</p>
    </article>
  );
}
