"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import type { AllowedDefect } from "@/components/annotate/types";
import { PhotoAnnotator, type CanvasLink } from "@/components/bench/photo-annotator";
import { putRegionSetAt } from "@/components/bench/regions-api";
import { SaverRegistry } from "@/components/bench/saver-registry";
import { useToolInHand } from "@/components/bench/tool-in-hand";
import { LeaseHeartbeat } from "@/components/queue/lease-heartbeat";
import { BatteryCaution, StaticCaution } from "@/components/ui/cautions";
import { benchClassOrder, startingClass } from "@/lib/annotate/class-order";
import { STATIC_SENSITIVE, type PartCategory } from "@/lib/part-types/schemas";
import { fetchOwnSet, recheckUrls, type BlindRecheckJson } from "./api";
import { RecheckGradePanel } from "./recheck-grade-panel";

/** A checklist reading as the auditor sees it: the value, never the first grader's verdict or name. */
function readingText(value: BlindRecheckJson["checklist"][number]["value"], unit?: string): string {
  if (value === null) return "not recorded";
  if ("pass" in value) return value.pass ? "works" : "does not work";
  if ("reading" in value) return `${value.reading}${unit ? ` ${unit}` : ""}`;
  return value.choice;
}

/**
 * The Bench in recheck mode: the same canvas, autosaver and tools (PhotoAnnotator), but on the
 * auditor's own region set and fed only by the blind read path (lib/recheck/blind-view.ts). No
 * grade, region, measurement or name of the first grade is on this screen or in its requests.
 */
export function RecheckBench({ view }: { view: BlindRecheckJson }) {
  const recheckId = view.recheck.id;
  const router = useRouter();
  const [selectedId, setSelectedId] = useState(view.photos[0]?.id ?? null);
  const [markingArea, setMarkingArea] = useState<HTMLElement | null>(null);
  const [regionSlot, setRegionSlot] = useState<HTMLElement | null>(null);
  const [statusSlot, setStatusSlot] = useState<HTMLElement | null>(null);
  const [submitted, setSubmitted] = useState(false);
  const registry = useMemo(() => new SaverRegistry((photoId, request) => putRegionSetAt(recheckUrls.regions(recheckId), { ...request, photoId })), [recheckId]);
  const { partType } = view.unit;
  const classKeys = useMemo(() => benchClassOrder(partType.defectClasses).map((d) => d.key), [partType.defectClasses]);
  const { hand, setHand } = useToolInHand({ area: markingArea, classKeys, startingDefect: startingClass(partType.defectClasses), readOnly: submitted });
  const allowedDefects = useMemo<AllowedDefect[]>(() => partType.defectClasses.map((d) => ({ key: d.key, label: d.label, severity: d.severity })), [partType.defectClasses]);
  const link = useMemo<CanvasLink>(() => ({ keyArea: markingArea, autoFocus: false, startWith: hand, onToolChange: setHand }), [markingArea, hand, setHand]);
  const release = useMutation({ mutationFn: () => fetch(recheckUrls.lease(recheckId), { method: "DELETE" }), onSuccess: () => router.push("/recheck") });

  const selected = view.photos.find((p) => p.id === selectedId) ?? null;
  const selectedView = selected ? partType.views.find((v) => v.key === selected.viewKey) : undefined;
  const viewLabel = (key: string) => partType.views.find((v) => v.key === key)?.label ?? key;

  return (
    <div className="flex h-full min-h-0 flex-col gap-2" data-testid="recheck-bench">
      <header className="flex shrink-0 flex-wrap items-center justify-between gap-2">
        <div className="min-w-0">
          <h1 className="truncate text-lg font-semibold">
            Blind recheck · {partType.name} {view.unit.serial ?? "(no serial)"}
          </h1>
          <p className="text-sm text-gauge-700">Mark what you see and grade it under rubric version {view.recheck.rubricVersion}. The first grade stays hidden until you submit.</p>
        </div>
        {!submitted && (
          <div className="flex items-center gap-2">
            <LeaseHeartbeat unitId={recheckId} leaseUrl={recheckUrls.lease(recheckId)} showPutBack={false} />
            <button
              type="button"
              className="btn-secondary h-8 py-0 text-sm"
              onClick={() => release.mutate()}
              disabled={release.isPending}
              title="Put the recheck back for another auditor; your marks on it are dropped"
            >
              Put back
            </button>
          </div>
        )}
      </header>
      <div className="flex min-h-0 flex-1 flex-col gap-2 lg:flex-row">
        <div ref={setMarkingArea} className="flex min-h-[26rem] min-w-0 flex-1 flex-col gap-2 lg:min-h-0" data-testid="marking-area">
          <div className="relative flex min-h-0 flex-1 flex-col">
            {selected && selected.preview ? (
              <PhotoAnnotator
                key={selected.id}
                sessionScope="recheck"
                photo={{
                  id: selected.id,
                  fileName: viewLabel(selected.viewKey),
                  width: selected.width,
                  height: selected.height,
                  preview: selected.preview,
                  urls: { thumbnail: `/api/photos/${selected.id}/thumbnail`, preview: `/api/photos/${selected.id}/preview`, original: `/api/photos/${selected.id}/original` },
                }}
                loadSet={(photoId) => fetchOwnSet(recheckId, photoId)}
                viewLabel={viewLabel(selected.viewKey)}
                allowedDefects={allowedDefects}
                zones={selectedView?.zones ?? []}
                lock={submitted ? "This recheck is submitted." : null}
                screenView={false}
                registry={registry}
                slots={{ regions: regionSlot, suggestions: null, status: statusSlot }}
                link={link}
              />
            ) : (
              <p className="flex flex-1 items-center justify-center rounded-lg border border-dashed border-gauge-300 p-6 text-sm text-gauge-700">This unit has no processed photo.</p>
            )}
          </div>
          <nav aria-label="Photos of the unit" className="flex shrink-0 gap-2 overflow-x-auto">
            {view.photos.map((photo) => (
              <button
                key={photo.id}
                type="button"
                aria-pressed={photo.id === selectedId}
                className={`shrink-0 rounded-md border-2 p-0.5 ${photo.id === selectedId ? "border-signal-600" : "border-transparent"}`}
                onClick={() => setSelectedId(photo.id)}
              >
                {/* eslint-disable-next-line @next/next/no-img-element -- a same-origin API image, sized by CSS */}
                <img src={`/api/photos/${photo.id}/thumbnail`} alt={`${viewLabel(photo.viewKey)} photo`} className="h-14 w-auto rounded" />
              </button>
            ))}
            <div ref={setStatusSlot} className="ml-auto self-center" />
          </nav>
        </div>
        <aside className="flex min-h-0 flex-col gap-3 overflow-y-auto lg:w-96" aria-label="Recheck panels">
          <section className="space-y-2" aria-label="Your regions">
            <h2 className="text-base font-semibold">Your regions</h2>
            <div ref={setRegionSlot} data-testid="region-slot" />
          </section>
          <section className="space-y-2" aria-label="Functional checklist readings">
            <h2 className="text-base font-semibold">Functional checklist readings</h2>
            {partType.category === "battery" && <BatteryCaution />}
            {STATIC_SENSITIVE.includes(partType.category as PartCategory) && <StaticCaution />}
            {view.checklist.length === 0 ? (
              <p className="text-sm text-gauge-700">This part type has no checklist items.</p>
            ) : (
              <dl className="divide-y divide-gauge-100 text-sm">
                {view.checklist.map(({ item, value }) => (
                  <div key={item.id} className="flex justify-between gap-3 py-1">
                    <dt>{item.label}</dt>
                    <dd className="font-medium">{readingText(value, item.kind === "numeric" ? item.unit : undefined)}</dd>
                  </div>
                ))}
              </dl>
            )}
          </section>
          <RecheckGradePanel recheckId={recheckId} beforeMeasure={() => registry.flushAll()} onSubmitted={() => setSubmitted(true)} />
        </aside>
      </div>
    </div>
  );
}
