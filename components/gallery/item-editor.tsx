"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useId, useRef, useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import type { GalleryItemDto } from "@/lib/gallery/dto";
import { CAPTION_MAX, type GalleryKind } from "@/lib/gallery/rules";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { ApiError, apiFetch } from "@/lib/http/client";
import { ItemCanvas, type ItemPartType } from "./item-canvas";
import { galleryKeys } from "@/lib/query-keys/gallery";

/**
 * A trainer's edit of one item: the same canvas as the Bench (editable), the caption, the grade it
 * deserves and normal/abnormal, saved together with the revision the edit started from. Nothing
 * is saved until Save; a save over someone else's newer one is refused and offers to reload.
 */
export function ItemEditor({ item, partType, onDone }: { item: GalleryItemDto; partType: ItemPartType; onDone: () => void }) {
  const queryClient = useQueryClient();
  const [caption, setCaption] = useState(item.caption);
  const [grade, setGrade] = useState<Grade>(item.grade);
  const [kind, setKind] = useState<GalleryKind>(item.kind);
  const regionsRef = useRef<RegionSetPayload | null>(null);
  const [regionsChanged, setRegionsChanged] = useState(false);
  const captionId = useId();
  const save = useMutation({
    mutationFn: () =>
      apiFetch<{ item: GalleryItemDto }>(`/api/gallery/${item.id}`, {
        method: "PATCH",
        body: { revision: item.revision, caption, grade, kind, ...(regionsRef.current ? { regions: regionsRef.current } : {}) },
      }),
    onSuccess: ({ item: saved }) => {
      queryClient.setQueryData(galleryKeys.item(item.id), { item: saved });
      void queryClient.invalidateQueries({ queryKey: galleryKeys.references() });
      onDone();
    },
  });
  const conflict = save.error instanceof ApiError && save.error.status === 409;
  const reload = async () => {
    await queryClient.invalidateQueries({ queryKey: galleryKeys.item(item.id) });
    onDone();
  };
  const dirty = regionsChanged || caption !== item.caption || grade !== item.grade || kind !== item.kind;
  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_24rem]" data-testid="gallery-editor">
      <ItemCanvas
        item={item}
        regions={item.regions}
        partType={partType}
        readOnly={false}
        onChange={(payload) => {
          regionsRef.current = payload;
          setRegionsChanged(true);
        }}
      />
      <form
        className="card space-y-3 self-start p-4"
        onSubmit={(e) => {
          e.preventDefault();
          save.mutate();
        }}
      >
        <div>
          <label htmlFor={captionId} className="field-label">
            Caption: why it has its grade
          </label>
          <textarea
            id={captionId}
            className="field-input min-h-28"
            maxLength={CAPTION_MAX}
            value={caption}
            onChange={(e) => setCaption(e.target.value)}
            placeholder="e.g. Hairline across the lens window, about 0.6 % of the window: B"
            data-testid="caption-input"
          />
          <p className="mt-0.5 text-right text-xs text-gauge-600">
            {caption.length} / {CAPTION_MAX}
          </p>
        </div>
        {/* One above the other in the 24rem side column (lg), where two side by side cut the choices' text. */}
        <div className="grid grid-cols-2 gap-2 lg:grid-cols-1">
          <label className="field-label">
            Grade it deserves
            <select className="field-input mt-1" value={grade} onChange={(e) => setGrade(e.target.value as Grade)} data-testid="grade-input">
              {GRADES.map((g) => (
                <option key={g}>{g}</option>
              ))}
            </select>
          </label>
          <label className="field-label">
            Shows
            <select className="field-input mt-1" value={kind} onChange={(e) => setKind(e.target.value as GalleryKind)} data-testid="kind-input">
              <option value="normal">Normal (nothing to mark)</option>
              <option value="abnormal">Abnormal (defects)</option>
            </select>
          </label>
        </div>
        <p className="text-xs text-gauge-700">
          Mark the defects on the photo with the tools beside it; a normal item needs no defect regions (a Surface is fine). A changed grade is recorded as judged under the rubric published now.
        </p>
        {save.error && (
          <FormMessage kind="error">
            {save.error.message}{" "}
            {conflict && (
              <button type="button" className="font-medium underline" onClick={() => void reload()}>
                Load their version
              </button>
            )}
          </FormMessage>
        )}
        <div className="flex flex-wrap gap-2">
          <button type="submit" className="btn-primary" disabled={!dirty || save.isPending} data-testid="save-item">
            {save.isPending ? "Saving…" : "Save"}
          </button>
          <button type="button" className="btn-secondary" onClick={onDone} disabled={save.isPending}>
            {dirty ? "Discard changes" : "Done"}
          </button>
        </div>
      </form>
    </div>
  );
}
