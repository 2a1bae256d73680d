"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { ProgressBar } from "@/components/photos/progress-bar";
import { putWithProgress } from "@/components/photos/put-with-progress";
import { FormMessage } from "@/components/ui/form-field";
import { useHydrated } from "@/components/ui/use-hydrated";
import type { GalleryItemDto } from "@/lib/gallery/dto";
import type { GalleryKind } from "@/lib/gallery/rules";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { apiFetch } from "@/lib/http/client";

type Choice = { id: string; name: string; views: { key: string; label: string }[] };
type Intent = { ticket: string; upload: { url: string; headers: Record<string, string> } };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Part type, view, normal/abnormal, grade and one file → the same three steps as a unit's photo
 * (intent, PUT to the store, finalise). A photo still processing answers 202: the same ticket is
 * sent again until the draft item exists, then its page opens.
 */
export function GalleryUploadForm({ partTypes }: { partTypes: Choice[] }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const ids = { partType: useId(), view: useId(), file: useId() };
  const [partTypeId, setPartTypeId] = useState(partTypes[0]?.id ?? "");
  const views = partTypes.find((p) => p.id === partTypeId)?.views ?? [];
  const [viewKey, setViewKey] = useState(views[0]?.key ?? "");
  const [kind, setKind] = useState<GalleryKind>("abnormal");
  const [grade, setGrade] = useState<Grade>("B");
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);

  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    if (!file) return setError("Choose the photo to upload.");
    setError(null);
    try {
      setProgress(0);
      const intent = await apiFetch<Intent>("/api/gallery/uploads", { body: { partTypeId, viewKey, kind, grade, fileName: file.name, contentType: file.type, bytes: file.size } });
      await putWithProgress(intent.upload.url, file, {
        headers: intent.upload.headers,
        onProgress: (loaded, total) => setProgress(total ? (100 * loaded) / total : 0),
        signal: new AbortController().signal,
      });
      for (let attempt = 0; attempt < 40; attempt++) {
        const res = await fetch("/api/gallery/photos", { method: "POST", headers: { "Content-Type": "application/json" }, body: JSON.stringify({ ticket: intent.ticket }) });
        const body = (await res.json().catch(() => null)) as { item?: GalleryItemDto; error?: { message: string } } | null;
        if (res.status === 202) {
          await sleep(1500);
          continue;
        }
        if (!res.ok || !body?.item) throw new Error(body?.error?.message ?? `The server answered ${res.status}.`);
        router.push(`/gallery/${body.item.id}`);
        return;
      }
      throw new Error("The photo is taking long to process. Look for the new draft in the Gallery in a minute.");
    } catch (err) {
      setProgress(null);
      setError(err instanceof Error ? err.message : String(err));
    }
  };

  const busy = progress !== null;
  return (
    <form className="card space-y-3 p-4" onSubmit={(e) => void submit(e)} data-testid="gallery-upload-form">
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor={ids.partType} className="field-label">
            Part type
          </label>
          <select
            id={ids.partType}
            className="field-input"
            value={partTypeId}
            onChange={(e) => {
              setPartTypeId(e.target.value);
              setViewKey(partTypes.find((p) => p.id === e.target.value)?.views[0]?.key ?? "");
            }}
          >
            {partTypes.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={ids.view} className="field-label">
            View
          </label>
          <select id={ids.view} className="field-input" value={viewKey} onChange={(e) => setViewKey(e.target.value)}>
            {views.map((v) => (
              <option key={v.key} value={v.key}>
                {v.label}
              </option>
            ))}
          </select>
        </div>
        <fieldset>
          <legend className="field-label">It shows</legend>
          <div className="flex gap-4 text-sm">
            {(["normal", "abnormal"] as const).map((k) => (
              <label key={k} className="flex items-center gap-1.5">
                <input
                  type="radio"
                  name="kind"
                  value={k}
                  checked={kind === k}
                  onChange={() => {
                    setKind(k);
                    if (k === "normal") setGrade("A");
                  }}
                />
                {k === "normal" ? "A normal part" : "Defects"}
              </label>
            ))}
          </div>
        </fieldset>
        <label className="field-label">
          Grade it deserves
          <select className="field-input mt-1" value={grade} onChange={(e) => setGrade(e.target.value as Grade)}>
            {GRADES.map((g) => (
              <option key={g}>{g}</option>
            ))}
          </select>
        </label>
      </div>
      <div>
        <label htmlFor={ids.file} className="field-label">
          Photo
        </label>
        <input id={ids.file} type="file" accept="image/*" className="block text-sm" disabled={!hydrated || busy} onChange={(e) => setFile(e.target.files?.[0] ?? null)} data-testid="gallery-file" />
      </div>
      {progress !== null && (
        <div className="space-y-1">
          <p className="text-sm text-gauge-700" role="status">
            {progress < 100 ? "Uploading…" : "Processing the photo…"}
          </p>
          <ProgressBar label="Upload" value={progress} />
        </div>
      )}
      {error && <FormMessage kind="error">{error}</FormMessage>}
      <button type="submit" className="btn-primary" disabled={!hydrated || busy || !file || !viewKey} data-testid="gallery-upload-submit">
        {busy ? "Uploading…" : "Upload and open the draft"}
      </button>
    </form>
  );
}
