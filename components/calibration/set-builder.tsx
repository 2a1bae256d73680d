"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { GalleryCard } from "@/components/gallery/gallery-card";
import { FormMessage } from "@/components/ui/form-field";
import { DEFAULT_CALIBRATION_THRESHOLDS, SET_MAX_ITEMS, SET_MIN_ITEMS } from "@/lib/calibration/schemas";
import type { GalleryCardDto } from "@/lib/gallery/dto";
import { apiFetch } from "@/lib/http/client";

export type BuilderItem = GalleryCardDto & { viewLabel: string; classKeys: string[]; classLabels: Record<string, string> };

/**
 * The set builder: pick examples (the order picked is the order taken), name the set and set its
 * pass thresholds (shown as percent and IoU, sent as fractions). The server checks everything
 * again and names what it refuses; nothing is stored on a refusal.
 */
export function SetBuilder({ items, more }: { items: BuilderItem[]; more: boolean }) {
  const router = useRouter();
  const [picked, setPicked] = useState<string[]>([]);
  const [name, setName] = useState("");
  const [agreementPercent, setAgreementPercent] = useState(String(DEFAULT_CALIBRATION_THRESHOLDS.minGradeAgreement * 100));
  const [minIou, setMinIou] = useState(String(DEFAULT_CALIBRATION_THRESHOLDS.minMeanIou));
  const nameId = useId();
  const create = useMutation({
    mutationFn: () =>
      apiFetch<{ set: { id: string } }>("/api/calibration/sets", {
        method: "POST",
        body: { name, itemIds: picked, thresholds: { minGradeAgreement: Number(agreementPercent) / 100, minMeanIou: Number(minIou) } },
      }),
    onSuccess: ({ set }) => router.push(`/calibration/sets/${set.id}`),
  });
  const toggle = (id: string) => setPicked((now) => (now.includes(id) ? now.filter((p) => p !== id) : [...now, id]));
  const countOk = picked.length >= SET_MIN_ITEMS && picked.length <= SET_MAX_ITEMS;
  return (
    <form
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate();
      }}
      data-testid="set-builder"
    >
      <div className="card grid gap-3 p-4 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]">
        <div>
          <label htmlFor={nameId} className="field-label">
            Name
          </label>
          <input
            id={nameId}
            className="field-input"
            value={name}
            maxLength={120}
            onChange={(e) => setName(e.target.value)}
            placeholder="e.g. Camera modules, front view, spring round"
            data-testid="set-name"
          />
        </div>
        <label className="field-label">
          Pass: grades as the key (%)
          <input type="number" min={0} max={100} step={1} className="field-input mt-1" value={agreementPercent} onChange={(e) => setAgreementPercent(e.target.value)} data-testid="set-min-agreement" />
        </label>
        <label className="field-label">
          Pass: mean IoU per defect class (0–1)
          <input type="number" min={0} max={1} step={0.05} className="field-input mt-1" value={minIou} onChange={(e) => setMinIou(e.target.value)} data-testid="set-min-iou" />
        </label>
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <p className="text-sm text-gauge-800" aria-live="polite" data-testid="picked-count">
          {picked.length} chosen {countOk ? "" : `(a set takes ${SET_MIN_ITEMS}–${SET_MAX_ITEMS})`}
        </p>
        <button type="submit" className="btn-primary" disabled={create.isPending || create.isSuccess} data-testid="create-set">
          {create.isPending ? "Making the set…" : "Make the set"}
        </button>
      </div>
      {create.error && <FormMessage kind="error">{create.error.message}</FormMessage>}
      {more && <p className="text-sm text-gauge-700">The newest 100 published examples are offered here; narrow the Gallery or retire old ones to reach others.</p>}
      <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4 xl:grid-cols-5" data-testid="builder-items">
        {items.map((item) => {
          const place = picked.indexOf(item.id);
          return (
            <li key={item.id} className={place >= 0 ? "rounded-lg ring-2 ring-gauge-700 ring-offset-2" : ""}>
              <GalleryCard
                item={item}
                viewLabel={item.viewLabel}
                classLabels={item.classLabels}
                classKeys={item.classKeys}
                showStatus={false}
                href={`/gallery/${item.id}`}
                action={
                  <label className="flex items-center gap-2 text-sm font-medium">
                    <input type="checkbox" checked={place >= 0} onChange={() => toggle(item.id)} data-testid="pick-item" />
                    {place >= 0 ? `Item ${place + 1} of the set` : "Put in the set"}
                  </label>
                }
              />
            </li>
          );
        })}
      </ul>
    </form>
  );
}
