/**
 * The Gallery's rules, as plain functions (no database): what each status allows, what an item
 * needs before inspectors see it, which classes it shows, how big its region set may be, and the
 * order of the Bench's reference panel.
 *
 * Decisions:
 * - Draft → published → retired. Only a draft is published; a draft or a published item may be
 *   retired (a discarded draft, an example that no longer fits); a retired item is kept, read-only,
 *   so a calibration key or a report that cited it still finds it. Editing a published item is
 *   allowed (a better caption, a corrected region) and shows at once.
 * - "Normal" means nothing to mark: no defect regions and grade A (a Surface is fine). "Abnormal"
 *   means the photo shows at least one defect region. Checked when publishing, so a draft may be
 *   incomplete while the trainer works on it.
 * - A caption is required to publish: the gallery teaches *why* an example has its grade.
 * - Region sets are smaller than on the Bench (GALLERY_MAX_REGIONS, GALLERY_MAX_POINTS): a
 *   reference example shows a few clear defects, and the list draws every item's regions over its
 *   thumbnail, so each card's JSON must stay small.
 * - Reference panel order: normal first, then by grade A → Reject, then newest.
 */
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { gradeRank, type Grade } from "@/lib/grading/rubric-schema";

export const GALLERY_STATUSES = ["draft", "published", "retired"] as const;
export type GalleryStatus = (typeof GALLERY_STATUSES)[number];
export const GALLERY_KINDS = ["normal", "abnormal"] as const;
export type GalleryKind = (typeof GALLERY_KINDS)[number];

export const GALLERY_MAX_REGIONS = 100;
export const GALLERY_MAX_POINTS = 20_000;
export const CAPTION_MAX = 600;

export type GalleryAction = "edit" | "publish" | "retire";

const ALLOWED_FROM: Record<GalleryAction, readonly GalleryStatus[]> = {
  edit: ["draft", "published"],
  publish: ["draft"],
  retire: ["draft", "published"],
};

/** Null when `action` is allowed on an item in `status`, else the sentence that says why not. */
export function transitionProblem(status: GalleryStatus, action: GalleryAction): string | null {
  if (ALLOWED_FROM[action].includes(status)) return null;
  if (status === "retired") return "This item is retired: it is kept as it was and can no longer change.";
  if (action === "publish") return "This item is already published.";
  return `This item is ${status}; it cannot be ${action === "retire" ? "retired" : "changed"} now.`;
}

/** The defect classes a region set shows, sorted and without repeats. */
export function defectClassesOf(payload: RegionSetPayload): string[] {
  return [...new Set(payload.regions.map((r) => r.defect))].sort();
}

const pointsOf = (payload: RegionSetPayload) => [...payload.regions, ...payload.surfaces].reduce((sum, r) => sum + ("points" in r.shape ? r.shape.points.length : 1), 0);

/** Null when the set fits a gallery item, else the sentence (the Bench's own limits are checked separately). */
export function regionBudgetProblem(payload: RegionSetPayload): string | null {
  if (payload.regions.length > GALLERY_MAX_REGIONS) {
    return `A gallery item may show at most ${GALLERY_MAX_REGIONS} defect regions (this one has ${payload.regions.length}); keep the clearest ones.`;
  }
  const points = pointsOf(payload);
  if (points > GALLERY_MAX_POINTS) return `A gallery item's regions may hold at most ${GALLERY_MAX_POINTS} points in all (these hold ${points}); simplify the longest outlines.`;
  return null;
}

export type PublishCheckInput = { kind: GalleryKind; grade: Grade; caption: string; regions: RegionSetPayload; photoReady: boolean };

/** Everything that stops a draft from being published, as sentences (empty: it may be published). */
export function publishProblems(item: PublishCheckInput): string[] {
  const problems: string[] = [];
  if (!item.photoReady) problems.push("Its photo is not ready yet.");
  if (item.caption.trim().length === 0) problems.push('Write a caption that says why it has its grade (e.g. "hairline across the lens window, about 0.6 % of the window: B").');
  if (item.kind === "normal") {
    if (item.regions.regions.length > 0) problems.push("A normal item shows nothing to mark: remove its defect regions, or call it abnormal.");
    if (item.grade !== "A") problems.push(`A normal item deserves grade A, not ${item.grade}: call it abnormal, or set grade A.`);
  } else if (item.regions.regions.length === 0) {
    problems.push("An abnormal item needs at least one defect region that shows what is wrong.");
  }
  return problems;
}

/** What a promoted photo is called when it arrives: abnormal when the unit's regions show a defect. */
export const kindFromRegions = (payload: RegionSetPayload): GalleryKind => (payload.regions.length > 0 ? "abnormal" : "normal");

export type ReferenceSortable = { kind: GalleryKind; grade: Grade; createdAt: Date | string; id: string };

/** The reference panel's order: normal first, then A → Reject, then newest, then id (total). */
export function compareForReference(a: ReferenceSortable, b: ReferenceSortable): number {
  const kind = (a.kind === "normal" ? 0 : 1) - (b.kind === "normal" ? 0 : 1);
  if (kind) return kind;
  const grade = gradeRank(a.grade) - gradeRank(b.grade);
  if (grade) return grade;
  const time = new Date(b.createdAt).getTime() - new Date(a.createdAt).getTime();
  if (time) return time;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}
