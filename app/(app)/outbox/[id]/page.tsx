import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getOutgoingEmail } from "@/db/queries/emails";
import { requirePageUser } from "@/lib/auth/require-user";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { localInboxDir } from "@/lib/env";
import { readDeliveredMessage } from "@/lib/mail/inbox";
import { linkifyText } from "@/lib/mail/linkify";
import { formatDateTime } from "@/lib/time/format";

export const metadata: Metadata = { title: "Outbox message" };

export default async function OutboxMessagePage(props: PageProps<"/outbox/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "outbox.read", from: `/outbox/${rawId}` });
  const inbox = localInboxDir();
  if (!inbox) notFound();
  const id = pageIdOrNotFound(rawId);
  const email = await getOutgoingEmail({ workspaceId: user.workspaceId, emailId: id });
  if (!email) notFound();
  const delivered = email.messageId ? await readDeliveredMessage(inbox, email.messageId) : null;
  return (
    <div className="max-w-3xl space-y-4">
      <Link href="/outbox" className="text-sm text-gauge-600 underline">
        ← Outbox
      </Link>
      <h1 className="page-title">{email.subject}</h1>
      {!delivered ? (
        <p className="text-fault-700">{email.status === "failed" ? `Sending failed: ${email.error}` : "The local inbox has no copy of this message."}</p>
      ) : (
        <article className="card space-y-3 p-5" data-testid="delivered-message">
          <dl className="grid grid-cols-[6rem_1fr] gap-y-1 text-sm">
            <dt className="text-gauge-600">From</dt>
            <dd>{delivered.from}</dd>
            <dt className="text-gauge-600">To</dt>
            <dd>{delivered.to}</dd>
            <dt className="text-gauge-600">Date</dt>
            <dd>{delivered.date ? formatDateTime(delivered.date, user.timeZone) : "—"}</dd>
            <dt className="text-gauge-600">Size</dt>
            <dd>{delivered.rawSize.toLocaleString("en")} bytes</dd>
          </dl>
          {/* The plain-text part is shown (never the HTML) so nothing in a message can run here; its web addresses are links. */}
          <pre className="whitespace-pre-wrap break-words rounded bg-gauge-50 p-3 text-sm" data-testid="message-text">
            {linkifyText(delivered.text).map((part, i) =>
              part.kind === "link" ? (
                <a key={i} href={part.href} className="text-gauge-700 underline" rel="noreferrer noopener">
                  {part.href}
                </a>
              ) : (
                part.text
              ),
            )}
          </pre>
          {delivered.attachments.length > 0 && (
            <ul className="text-sm">
              {delivered.attachments.map((a) => (
                <li key={a.filename}>
                  📎 {a.filename} ({a.contentType}, {a.size.toLocaleString("en")} bytes)
                </li>
              ))}
            </ul>
          )}
        </article>
      )}
    </div>
  );
}
