import { GradeBadge } from "@/components/grading/grade-badge";
import type { GalleryKind, GalleryStatus } from "@/lib/gallery/rules";
import type { Grade } from "@/lib/grading/rubric-schema";

const STATUS_STYLE: Record<GalleryStatus, string> = {
  draft: "border-signal-500 bg-signal-50 text-signal-700",
  published: "border-gauge-300 bg-white text-gauge-800",
  retired: "border-gauge-300 bg-gauge-100 text-gauge-700 line-through",
};

/** Grade, normal/abnormal in words, and (for editors) the status: text first, colour only helps. */
export function ItemBadges({ grade, kind, status, showStatus }: { grade: Grade; kind: GalleryKind; status: GalleryStatus; showStatus: boolean }) {
  return (
    <span className="inline-flex flex-wrap items-center gap-1">
      <GradeBadge grade={grade} size="sm" />
      <span className={`rounded-md border px-1.5 text-xs font-medium ${kind === "normal" ? "border-ok-600 text-ok-600" : "border-gauge-400 text-gauge-800"}`}>
        {kind === "normal" ? "Normal" : "Abnormal"}
      </span>
      {showStatus && status !== "published" && <span className={`rounded-md border px-1.5 text-xs font-medium ${STATUS_STYLE[status]}`}>{status === "draft" ? "Draft" : "Retired"}</span>}
    </span>
  );
}
