"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { useDateTime } from "@/components/ui/time-zone";
import { CLAIM_STATUS_LABELS, CLAIM_STATUSES, type ClaimStatus } from "@/lib/evidence/claim-status";
import { apiFetch, type ApiError } from "@/lib/http/client";
import { deliveryText } from "@/lib/mail/delivery-text";
import { evidenceKeys } from "@/lib/query-keys/evidence";
import { formatBytes, type EvidencePackView } from "./types";

const EMAIL_TONE = { sent: "text-ok-600", queued: "text-signal-700", failed: "text-fault-700" } as const;

/** The e-mail's delivery state in words (lib/mail/delivery-text.ts, as the Outbox says it). */
const packDeliveryText = (p: EvidencePackView) => deliveryText({ status: p.emailStatus, attempts: p.emailAttempts, error: p.emailError });

/** One pack: what went to whom and how it stands, and its claim with a status form. */
export function EvidencePackItem({ pack, showLot = false }: { pack: EvidencePackView; showLot?: boolean }) {
  const queryClient = useQueryClient();
  const formatDateTime = useDateTime();
  const [status, setStatus] = useState<ClaimStatus>(pack.claimStatus);
  const [note, setNote] = useState(pack.claimNote);
  const save = useMutation<unknown, ApiError>({
    mutationFn: () => apiFetch(`/api/claims/${pack.claimId}`, { method: "PATCH", body: { status, note, version: pack.claimVersion } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: evidenceKeys.all }),
  });
  const withdraw = useMutation<unknown, ApiError>({
    mutationFn: () => apiFetch(`/api/evidence-packs/${pack.id}/revoke`, { body: {} }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: evidenceKeys.all }),
  });
  const total = pack.attachments.reduce((sum, a) => sum + a.bytes, 0);
  return (
    <li className="space-y-2 rounded-md border border-gauge-200 p-3 text-sm" data-testid={`evidence-${pack.claimReference}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <span className="font-medium">
          Claim <span className="font-mono">{pack.claimReference}</span>
          {showLot && (
            <>
              {" "}
              · lot{" "}
              <Link className="underline" href={`/lots/${pack.lotId}`}>
                {pack.purchaseRef}
              </Link>
            </>
          )}
        </span>
        <span className="text-xs text-gauge-600">
          {formatDateTime(pack.createdAt)} by {pack.createdByName}
        </span>
      </div>
      <p>
        To {pack.toAddress}: “{pack.subject}”
      </p>
      <p className={EMAIL_TONE[pack.emailStatus]} data-testid="evidence-delivery">
        E-mail {packDeliveryText(pack)}
      </p>
      <p className="text-xs text-gauge-600">
        {pack.attachments.length} files, {formatBytes(total)}
        {pack.delivery === "link" ? " behind an evidence link" : " attached"}: {pack.attachments.map((a) => a.filename).join(", ")}
      </p>
      {pack.delivery === "link" && (
        <div className="flex flex-wrap items-center gap-2 text-xs" data-testid="evidence-link-state">
          {pack.revokedAt ? (
            <span className="text-gauge-700">Evidence link withdrawn {formatDateTime(pack.revokedAt)}.</span>
          ) : (
            <>
              <span>
                Evidence link open until {pack.linkExpiresAt ? formatDateTime(pack.linkExpiresAt) : "—"}
                {pack.linkUrl && (
                  <>
                    {" "}
                    (
                    <a className="underline" href={pack.linkUrl} target="_blank" rel="noreferrer">
                      open
                    </a>
                    )
                  </>
                )}
              </span>
              <button type="button" className="btn-secondary px-2 py-0.5 text-xs" disabled={withdraw.isPending} onClick={() => withdraw.mutate()}>
                Withdraw link
              </button>
            </>
          )}
          {withdraw.error && (
            <span role="alert" className="text-fault-700">
              {withdraw.error.message}
            </span>
          )}
        </div>
      )}
      <form
        className="flex flex-wrap items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          save.mutate();
        }}
      >
        <label>
          <span className="field-label">Claim status</span>
          <select className="field-input" value={status} onChange={(e) => setStatus(e.target.value as ClaimStatus)}>
            {CLAIM_STATUSES.map((s) => (
              <option key={s} value={s}>
                {CLAIM_STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        <label className="min-w-48 flex-1">
          <span className="field-label">Note</span>
          <input className="field-input" value={note} maxLength={1000} onChange={(e) => setNote(e.target.value)} />
        </label>
        <button type="submit" className="btn-secondary" disabled={save.isPending}>
          Save claim
        </button>
      </form>
      {save.error && (
        <p role="alert" className="text-fault-700">
          {save.error.message}
        </p>
      )}
    </li>
  );
}
