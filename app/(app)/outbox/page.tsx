import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { listOutgoingEmails } from "@/db/queries/emails";
import { requirePageUser } from "@/lib/auth/require-user";
import { localInboxDir } from "@/lib/env";
import { deliveryText } from "@/lib/mail/delivery-text";
import { formatDateTime } from "@/lib/time/format";

export const metadata: Metadata = { title: "Outbox" };

const KIND_LABELS = { invitation: "Invitation", password_reset: "Password reset", supplier_evidence: "Supplier evidence", sign_up: "Sign-up" } as const;

export default async function OutboxPage() {
  const user = await requirePageUser({ permission: "outbox.read", from: "/outbox" });
  if (!localInboxDir()) notFound();
  const emails = await listOutgoingEmails({ workspaceId: user.workspaceId });
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">Outbox</h1>
        <p className="text-gauge-700">Development aid: e-mails this workspace sent, as the local inbox received them. It disappears when a real mail server is configured.</p>
      </div>
      <div className="card overflow-x-auto">
        <table className="min-w-full text-sm" data-testid="outbox-table">
          <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
            <tr>
              <th scope="col" className="px-4 py-2">
                Sent
              </th>
              <th scope="col" className="px-4 py-2">
                Kind
              </th>
              <th scope="col" className="px-4 py-2">
                To
              </th>
              <th scope="col" className="px-4 py-2">
                Subject
              </th>
              <th scope="col" className="px-4 py-2">
                Status
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-gauge-100">
            {emails.map((e) => (
              <tr key={e.id}>
                <td className="whitespace-nowrap px-4 py-2">{formatDateTime(e.createdAt, user.timeZone)}</td>
                <td className="px-4 py-2">{KIND_LABELS[e.kind]}</td>
                <td className="px-4 py-2">{e.toAddress}</td>
                <td className="px-4 py-2">
                  <Link href={`/outbox/${e.id}`} className="text-gauge-700 underline">
                    {e.subject}
                  </Link>
                </td>
                <td className={`px-4 py-2 ${e.status === "sent" ? "" : "text-fault-700"}`} data-testid={`outbox-status-${e.id}`}>
                  {deliveryText(e)}
                </td>
              </tr>
            ))}
            {emails.length === 0 && (
              <tr>
                <td colSpan={5} className="px-4 py-6 text-center text-gauge-600">
                  Nothing sent yet.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
