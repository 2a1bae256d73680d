"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useDateTime } from "@/components/ui/time-zone";
import { apiFetch, type ApiError } from "@/lib/http/client";
import { unitKeys } from "@/lib/query-keys/units";

type CertificateRow = {
  id: string;
  shortCode: string;
  contentHash: string;
  issuedAt: string;
  issuedByName: string;
  revokedAt: string | null;
  revokeReason: string | null;
  grade: string;
  verificationUrl: string;
};

/** A lead's condition certificates of the unit: issue one for the current grade, download, revoke with a reason. */
export function UnitCertificates({ unitId, graded }: { unitId: string; graded: boolean }) {
  const queryClient = useQueryClient();
  const formatDateTime = useDateTime();
  const key = unitKeys.certificates(unitId);
  const list = useQuery({ queryKey: key, queryFn: () => apiFetch<{ certificates: CertificateRow[] }>(`/api/units/${unitId}/certificates`) });
  const [revoking, setRevoking] = useState<string | null>(null);
  const [reason, setReason] = useState("");
  const issue = useMutation({ mutationFn: () => apiFetch(`/api/units/${unitId}/certificates`, { method: "POST", body: {} }), onSuccess: () => queryClient.invalidateQueries({ queryKey: key }) });
  const revoke = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/certificates/${id}/revoke`, { method: "POST", body: { reason } }),
    onSuccess: () => {
      setRevoking(null);
      setReason("");
      void queryClient.invalidateQueries({ queryKey: key });
    },
  });
  const error = (issue.error ?? revoke.error) as ApiError | null;
  return (
    <section className="space-y-2" aria-labelledby="certificates-title" data-testid="unit-certificates">
      <div className="flex items-center justify-between gap-2">
        <h3 id="certificates-title" className="text-sm font-semibold">
          Condition certificates
        </h3>
        <button type="button" className="btn-secondary" disabled={!graded || issue.isPending} onClick={() => issue.mutate()}>
          {issue.isPending ? "Issuing…" : "Issue certificate"}
        </button>
      </div>
      {!graded && <p className="text-xs text-gauge-600">A certificate states the unit&apos;s grade: grade it first.</p>}
      {error && (
        <p role="alert" className="text-sm text-fault-700">
          {error.message}
        </p>
      )}
      <ul className="space-y-2 text-sm">
        {(list.data?.certificates ?? []).map((c) => (
          <li key={c.id} className="rounded-md border border-gauge-200 p-2" data-testid={`certificate-${c.shortCode}`}>
            <div className="flex flex-wrap items-center justify-between gap-2">
              <span className="font-mono">{c.shortCode}</span>
              <span>grade {c.grade}</span>
              {c.revokedAt ? <span className="text-fault-700">revoked</span> : <span className="text-ok-600">valid</span>}
            </div>
            <p className="text-xs text-gauge-600">
              {formatDateTime(c.issuedAt)} by {c.issuedByName} · hash{" "}
              <span className="font-mono">
                {c.contentHash.slice(0, 8)} {c.contentHash.slice(8, 16)}…
              </span>
            </p>
            {c.revokeReason && <p className="text-xs">Revoked: {c.revokeReason}</p>}
            <div className="mt-1 flex gap-3">
              <a className="text-gauge-700 underline" href={`/api/certificates/${c.id}/pdf`} download>
                PDF
              </a>
              {/* The address the QR code holds: what a buyer's phone opens, signed out. */}
              <a className="text-gauge-700 underline" href={c.verificationUrl} target="_blank" rel="noreferrer" data-testid="verification-link">
                Verification page
              </a>
              {!c.revokedAt && revoking !== c.id && (
                <button type="button" className="text-fault-700 underline" onClick={() => setRevoking(c.id)}>
                  Revoke…
                </button>
              )}
            </div>
            {revoking === c.id && (
              <form
                className="mt-2 space-y-2"
                onSubmit={(e) => {
                  e.preventDefault();
                  revoke.mutate(c.id);
                }}
              >
                <label className="block">
                  <span className="field-label">Why is it revoked?</span>
                  <input className="field-input" value={reason} maxLength={500} onChange={(e) => setReason(e.target.value)} />
                </label>
                <div className="flex gap-2">
                  <button type="submit" className="btn-danger" disabled={revoke.isPending}>
                    Revoke certificate
                  </button>
                  <button type="button" className="btn-secondary" onClick={() => setRevoking(null)}>
                    Cancel
                  </button>
                </div>
              </form>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
