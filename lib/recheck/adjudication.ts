/**
 * When a recheck goes to adjudication: the grades differ, or on some photo a defect class's IoU is
 * under the workspace's threshold while either side marked a meaningful area of that class there.
 * Reads the stored comparison (compare.ts); every reason that applies is returned, so the
 * adjudicator sees why.
 *
 * "Meaningful" (our rule, c): the larger of the two sides' areas of the class on that photo is at
 * least max(meaningfulPx, ⌈meaningfulShare × the photo's Surface⌉). Below that, IoU says more
 * about how a speck was circled than about whether the two people saw the same thing: two 5 px
 * spots 3 px apart already have an IoU under 0.5. The defaults (100 px, 0.05 % of the Surface)
 * sit below the smallest non-zero share any starter rubric grades on (0.1 %), so an area that
 * could change a grade on its own is always meaningful; a tiny area that changes the grade shows
 * up as a grade difference instead. A class only one side marked has IoU 0 and triggers when the
 * marked area is meaningful.
 */
import type { RecheckComparison } from "./compare";
import type { RecheckSettings } from "./settings";

export type AdjudicationReason =
  { kind: "grade_differs"; first: string; recheck: string; steps: number } | { kind: "regions_differ"; photoId: string; defect: string; iou: number; largerPx: number; meaningfulPx: number };

export type AdjudicationDecision = { required: boolean; reasons: AdjudicationReason[] };

type TriggerSettings = Pick<RecheckSettings, "iouThreshold" | "meaningfulShare" | "meaningfulPx">;

/** The smallest meaningful area on a photo with this Surface, in pixels. */
export const meaningfulAreaPx = (surfacePx: number, settings: Pick<RecheckSettings, "meaningfulShare" | "meaningfulPx">): number =>
  Math.max(settings.meaningfulPx, Math.ceil(settings.meaningfulShare * surfacePx));

export function adjudicationDecision(comparison: RecheckComparison, settings: TriggerSettings): AdjudicationDecision {
  const reasons: AdjudicationReason[] = [];
  if (comparison.grade.steps > 0) reasons.push({ kind: "grade_differs", first: comparison.grade.first, recheck: comparison.grade.recheck, steps: comparison.grade.steps });
  for (const photo of comparison.photos) {
    const limit = meaningfulAreaPx(photo.surfacePx, settings);
    for (const [defect, entry] of Object.entries(photo.classes)) {
      const largerPx = Math.max(entry.firstPx, entry.recheckPx);
      if (entry.iou < settings.iouThreshold && largerPx >= limit) reasons.push({ kind: "regions_differ", photoId: photo.photoId, defect, iou: entry.iou, largerPx, meaningfulPx: limit });
    }
  }
  return { required: reasons.length > 0, reasons };
}

const percent = (value: number) => (Number.isFinite(value) ? `${Math.round(value * 100)} %` : "n/a");

/**
 * Why a recheck went to adjudication, in words (the adjudication screen and the demo seed's log):
 * reasons of the same class are told together ("swelling overlaps 0 % on 2 photos"), so a
 * disagreement where the grades agree says what differs instead of only naming two equal grades.
 */
export function adjudicationReasonsText(reasons: readonly AdjudicationReason[], label: (defect: string) => string = (defect) => defect): string {
  const parts: string[] = [];
  const regions = new Map<string, number[]>();
  for (const reason of reasons) {
    if (reason.kind === "grade_differs") parts.push(`the grades differ by ${reason.steps} step${reason.steps === 1 ? "" : "s"} (${reason.first} first, ${reason.recheck} on recheck)`);
    else regions.set(reason.defect, [...(regions.get(reason.defect) ?? []), reason.iou]);
  }
  for (const [defect, ious] of regions) {
    const overlap = ious.length === 1 ? percent(ious[0]) : `${percent(Math.min(...ious))} to ${percent(Math.max(...ious))}`;
    parts.push(`the ${label(defect)} regions overlap ${overlap} (IoU) on ${ious.length === 1 ? "one photo" : `${ious.length} photos`}`);
  }
  return parts.join("; ");
}
