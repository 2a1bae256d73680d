"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { usePathname, useRouter } from "next/navigation";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { useDateTime } from "@/components/ui/time-zone";
import type { Rubric } from "@/lib/grading/rubric-schema";
import { apiFetch } from "@/lib/http/client";
import { RubricDiff } from "./rubric-diff";
import { RubricEditor } from "./rubric-editor";
import { PreviewBar, RubricPreview, useSamplePreview } from "./rubric-preview";
import { RubricRulesTable } from "./rubric-rules-table";
import { type RubricVersionsResponse, type RubricVersionView } from "./types";
import { rubricKeys } from "@/lib/query-keys/rubrics";

const EMPTY_PART_TYPE: RubricVersionsResponse["partType"] = {
  id: "",
  slug: "",
  name: "",
  views: [],
  lists: { defects: [], zones: [], views: [] },
  severities: {},
  labels: { defects: {}, zones: {}, views: {} },
};

export type PartTypeOption = { id: string; name: string; publishedVersion: number | null; draftVersion: number | null };

function VersionList({ versions, selected, onSelect }: { versions: RubricVersionView[]; selected: number | null; onSelect: (v: number) => void }) {
  const dateTime = useDateTime();
  return (
    <ul className="flex flex-wrap gap-2" aria-label="Versions" data-testid="rubric-versions">
      {versions.map((v) => {
        const active = v.version === selected;
        const when =
          v.status === "published"
            ? `Published ${dateTime(v.publishedAt)}${v.publishedByName ? ` by ${v.publishedByName}` : ""}`
            : `Edited ${dateTime(v.updatedAt)}${v.updatedByName ? ` by ${v.updatedByName}` : ""}`;
        return (
          <li key={v.version}>
            <button
              type="button"
              aria-current={active ? "true" : undefined}
              onClick={() => onSelect(v.version)}
              title={when}
              className={`rounded-md border px-3 py-1.5 text-left text-sm transition-colors ${active ? "border-gauge-600 bg-gauge-100" : "border-gauge-200 bg-white hover:bg-gauge-50"}`}
            >
              <span className="flex items-center gap-2">
                <span className="font-semibold">Version {v.version}</span>
                <span className={`rounded px-1.5 py-0.5 text-xs ${v.status === "draft" ? "bg-signal-100 text-signal-700" : "bg-ok-50 text-ok-600"}`}>
                  {v.status === "draft" ? "draft" : "published"}
                </span>
              </span>
              <span className="block text-xs text-gauge-700">
                {v.status === "published" ? `Published ${dateTime(v.publishedAt)}` : `Edited ${dateTime(v.updatedAt)}`} · {v.rubric.rules.length} rule{v.rubric.rules.length === 1 ? "" : "s"}
              </span>
            </button>
          </li>
        );
      })}
    </ul>
  );
}

/** The Rubrics screen: pick a part type, read its versions, edit the draft with a live preview, compare versions. */
export function RubricScreen({ partTypes, initialPartTypeId, canDraft, canPublish }: { partTypes: PartTypeOption[]; initialPartTypeId: string | null; canDraft: boolean; canPublish: boolean }) {
  const dateTime = useDateTime();
  const router = useRouter();
  const pathname = usePathname();
  const queryClient = useQueryClient();
  const [partTypeId, setPartTypeId] = useState(initialPartTypeId ?? partTypes[0]?.id ?? null);
  const [picked, setPicked] = useState<number | null>(null);
  const [liveRubric, setLiveRubric] = useState<Rubric | null>(null);
  const data = useQuery({
    queryKey: rubricKeys.versions(partTypeId),
    queryFn: () => apiFetch<RubricVersionsResponse>(`/api/part-types/${partTypeId}/rubrics`),
    enabled: partTypeId !== null,
  });
  const openDraft = useMutation({
    mutationFn: () => apiFetch<{ version: number }>(`/api/part-types/${partTypeId}/rubrics`, { method: "POST" }),
    onSuccess: async (draft) => {
      await queryClient.invalidateQueries({ queryKey: rubricKeys.versions(partTypeId) });
      setPicked(draft.version);
    },
  });

  const versions = data.data?.versions ?? [];
  const draft = versions.find((v) => v.status === "draft") ?? null;
  const selected = versions.find((v) => v.version === picked) ?? draft ?? versions[0] ?? null;
  const editing = selected !== null && selected.status === "draft" && canDraft;
  const shownRubric = selected === null ? null : editing ? liveRubric : selected.rubric;
  const preview = useSamplePreview(shownRubric, data.data?.partType ?? EMPTY_PART_TYPE);
  if (partTypes.length === 0) return <p className="text-gauge-700">This workspace has no part types yet. A QC lead adds them first.</p>;
  const choosePartType = (id: string) => {
    setPartTypeId(id);
    setPicked(null);
    setLiveRubric(null);
    router.replace(`${pathname}?partType=${id}`, { scroll: false });
  };

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end gap-4">
        <div className="w-full sm:w-80">
          <label htmlFor="part-type" className="field-label">
            Part type
          </label>
          <select id="part-type" className="field-input" value={partTypeId ?? ""} onChange={(e) => choosePartType(e.target.value)}>
            {partTypes.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </div>
        {canDraft && !draft && data.isSuccess && (
          <button type="button" className="btn-primary" onClick={() => openDraft.mutate()} disabled={openDraft.isPending}>
            {openDraft.isPending ? "Opening…" : versions.length === 0 ? "Start a rubric" : `Open a draft from version ${versions[0].version}`}
          </button>
        )}
      </div>
      {openDraft.isError && <FormMessage kind="error">{openDraft.error.message}</FormMessage>}
      {data.isPending && <p className="text-sm text-gauge-700">Loading versions…</p>}
      {data.isError && <FormMessage kind="error">{data.error.message}</FormMessage>}

      {data.isSuccess && versions.length === 0 && <p className="text-gauge-700">{data.data.partType.name} has no rubric yet, so its units cannot be graded.</p>}

      {data.isSuccess && selected && (
        <div className="space-y-4">
          <div>
            <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-gauge-700">Versions</h2>
            <VersionList
              versions={versions}
              selected={selected.version}
              onSelect={(v) => {
                setPicked(v);
                setLiveRubric(null);
              }}
            />
          </div>
          {/* A rubric's notes travel with it: an example says so here, whoever opens it. */}
          {(selected.rubric.notes?.length ?? 0) > 0 && (
            <ul className="max-w-3xl list-disc space-y-0.5 rounded-md bg-gauge-50 py-2 pl-8 pr-3 text-sm text-gauge-800" aria-label="Notes of this version" data-testid="rubric-notes">
              {selected.rubric.notes!.map((note) => (
                <li key={note}>{note}</li>
              ))}
            </ul>
          )}
          <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_26rem]">
            <section className="card min-w-0 p-4 sm:p-5">
              {editing ? (
                <RubricEditor key={`${partTypeId}-${selected.version}`} partType={data.data.partType} draft={selected} canPublish={canPublish} onRubricChange={setLiveRubric} />
              ) : (
                <div className="space-y-3">
                  <div>
                    <h2 className="text-lg font-semibold">
                      Version {selected.version} {selected.status === "draft" ? "(draft)" : ""}
                    </h2>
                    <p className="text-sm text-gauge-700">
                      {selected.status === "published"
                        ? `Published ${dateTime(selected.publishedAt)}${selected.publishedByName ? ` by ${selected.publishedByName}` : ""}. Published versions never change.`
                        : "A draft: trainers edit it, a QC lead publishes it."}
                    </p>
                  </div>
                  <RubricRulesTable rubric={selected.rubric} partType={data.data.partType} />
                </div>
              )}
              <PreviewBar preview={preview} />
            </section>
            {/* Beside the rules on wide screens, and kept in view while scrolling through them. */}
            <div className="min-w-0 space-y-6 xl:sticky xl:top-4 xl:max-h-[calc(100vh-2rem)] xl:overflow-y-auto">
              <section className="card p-4" aria-labelledby="preview-title">
                <h2 id="preview-title" className="mb-3 text-lg font-semibold">
                  Live preview {editing ? "of the draft" : `of version ${selected.version}`}
                </h2>
                <RubricPreview rubric={shownRubric} partType={data.data.partType} preview={preview} />
              </section>
              <section className="card p-4" aria-labelledby="diff-title">
                <h2 id="diff-title" className="mb-3 text-lg font-semibold">
                  Differences between versions
                </h2>
                <RubricDiff key={`${partTypeId}-${versions.length}-${selected.version}`} versions={versions} partType={data.data.partType} defaultTo={selected.version} />
              </section>
            </div>
          </div>
        </div>
      )}
    </div>
  );
}
