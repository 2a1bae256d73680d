"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { apiFetch, type ApiError } from "@/lib/http/client";
import { evidenceKeys } from "@/lib/query-keys/evidence";
import { EvidencePackItem } from "./evidence-pack-item";
import { formatBytes, type EvidencePackView } from "./types";

type LotEvidence = { packs: EvidencePackView[]; refusal: string | null; template: { subject: string; body: string; placeholders: Record<string, string> } };
type Preview = { to: string; subject: string; text: string; claimRef: string; delivery: "attached" | "link"; totalBytes: number; attachments: { filename: string; bytes: number }[] };

/**
 * The lead's evidence for the supplier on a decided lot: edit the template, preview the e-mail
 * with its files, send it (the worker delivers it), and follow each pack's delivery and claim.
 */
export function EvidencePanel({ lotId }: { lotId: string }) {
  const queryClient = useQueryClient();
  const data = useQuery({
    queryKey: evidenceKeys.lot(lotId),
    queryFn: () => apiFetch<LotEvidence>(`/api/lots/${lotId}/evidence`),
    refetchInterval: (q) => (q.state.data?.packs.some((p) => p.emailStatus === "queued") ? 3000 : false),
  });
  const [draft, setDraft] = useState<{ subject: string; body: string; claimRef: string } | null>(null);
  const form = draft ?? (data.data ? { subject: data.data.template.subject, body: data.data.template.body, claimRef: "" } : null);
  const [preview, setPreview] = useState<Preview | null>(null);
  const edit = (patch: Partial<{ subject: string; body: string; claimRef: string }>) => {
    setDraft({ ...form!, ...patch });
    setPreview(null);
  };
  const previewing = useMutation<{ preview: Preview }, ApiError>({ mutationFn: () => apiFetch(`/api/lots/${lotId}/evidence/preview`, { body: form }), onSuccess: (r) => setPreview(r.preview) });
  const sending = useMutation<unknown, ApiError>({
    mutationFn: () => apiFetch(`/api/lots/${lotId}/evidence`, { body: form }),
    onSuccess: () => {
      setPreview(null);
      setDraft(null);
      void queryClient.invalidateQueries({ queryKey: evidenceKeys.all });
    },
  });
  if (data.isPending) return <p className="text-sm text-gauge-600">Loading evidence…</p>;
  if (data.error) return <p className="text-sm text-fault-700">{data.error.message}</p>;
  const { packs, refusal, template } = data.data;
  const error = previewing.error ?? sending.error;
  return (
    <section className="card space-y-4 p-5" aria-labelledby="evidence-title" data-testid="evidence-panel">
      <h2 id="evidence-title" className="text-lg font-semibold">
        Evidence for the supplier
      </h2>
      {refusal ? (
        <p className="text-sm text-gauge-700">{refusal}</p>
      ) : (
        form && (
          <form
            className="space-y-3"
            onSubmit={(e) => {
              e.preventDefault();
              previewing.mutate();
            }}
          >
            <label className="block">
              <span className="field-label">Subject</span>
              <input className="field-input" value={form.subject} onChange={(e) => edit({ subject: e.target.value })} />
            </label>
            <label className="block">
              <span className="field-label">Message</span>
              <textarea className="field-input font-mono text-xs" rows={12} value={form.body} onChange={(e) => edit({ body: e.target.value })} />
            </label>
            <p className="text-xs text-gauge-600">
              Placeholders:{" "}
              {Object.entries(template.placeholders)
                .map(([name, what]) => `{{${name}}} ${what}`)
                .join(" · ")}
            </p>
            <label className="block max-w-xs">
              <span className="field-label">Claim / RMA reference (empty: numbered for you)</span>
              <input className="field-input font-mono" value={form.claimRef} maxLength={40} onChange={(e) => edit({ claimRef: e.target.value })} />
            </label>
            {error && (
              <p role="alert" className="text-sm text-fault-700">
                {error.message}
              </p>
            )}
            <button type="submit" className="btn-secondary" disabled={previewing.isPending}>
              {previewing.isPending ? "Preparing the preview…" : "Preview"}
            </button>
          </form>
        )
      )}
      {preview && (
        <div className="space-y-2 rounded-md border border-gauge-300 bg-gauge-50 p-3 text-sm" data-testid="evidence-preview">
          <p>
            <span className="font-medium">To:</span> {preview.to}
          </p>
          <p>
            <span className="font-medium">Subject:</span> {preview.subject}
          </p>
          <pre className="whitespace-pre-wrap wrap-anywhere font-sans">{preview.text}</pre>
          {preview.delivery === "link" && (
            <p className="text-xs text-signal-700" data-testid="evidence-link-note">
              The files come to {formatBytes(preview.totalBytes)}, over what an e-mail may carry: they go behind an expiring evidence link you can withdraw.
            </p>
          )}
          <ul className="text-xs text-gauge-700">
            {preview.attachments.map((a) => (
              <li key={a.filename}>
                {a.filename} ({formatBytes(a.bytes)})
              </li>
            ))}
          </ul>
          <button type="button" className="btn-primary" disabled={sending.isPending} onClick={() => sending.mutate()}>
            {sending.isPending ? "Sending…" : `Send to ${preview.to}`}
          </button>
        </div>
      )}
      {packs.length > 0 && (
        <ul className="space-y-2" aria-label="Evidence sent">
          {packs.map((p) => (
            <EvidencePackItem key={p.id} pack={p} />
          ))}
        </ul>
      )}
    </section>
  );
}
