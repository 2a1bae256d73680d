/**
 * The annotated photos of a lot report (and of its evidence pack): each current photo with a
 * defect region of a defective unit, read from the object store and drawn at the report size.
 * lot-report-load.ts calls it with the database's rows and the store; bench/reports.ts calls the
 * same function against a local store, so the benchmark times this path and nothing else.
 *
 * Decisions (measured with bench/reports.ts; figures in the commit that made them):
 * - Source: the stored 2 560 px WebP preview (lib/imaging/normalize.ts), not the original. The
 *   original would decode somewhat faster when it is a JPEG (libjpeg shrinks on load to 1/2, 1/4
 *   or 1/8 while decoding, and sharp uses it for any resize) but it is 5–7 times the bytes to fetch,
 *   and originals also come as PNG or HEIC; the preview is always WebP and already upright.
 * - Size: ANNOTATED_EDGE.report (1 000 px on the long edge). The PDF prints two photos a page in a
 *   slot of at most 511 × 338 pt, so a 4:3 photo with its legend prints about 5.8 in wide: 1 000 px
 *   is ~170 dpi there (150–200 dpi is the usual print target, common practice). The evidence pack
 *   attaches these same JPEGs: a 12 MP original shrunk four times, every region drawn with a
 *   minimum stroke and a halo, so the place and kind of each defect read on screen; the supplier
 *   who needs more asks for the originals (they are kept unchanged).
 * - Work: at most `concurrency` photos in flight (fetch, decode, draw, encode), by default one per
 *   CPU up to 4. The web process runs sharp with one libvips thread per image (glibc default
 *   without MALLOC_ARENA_MAX), so one photo at a time used one core of the machine's two.
 * - Order: as the rows come (sample index, then when the photo was taken), whatever finishes first.
 */
import { availableParallelism } from "node:os";
import type { Shape } from "@/lib/geometry/shape";
import { mapBounded } from "@/lib/async/map-bounded";
import { ANNOTATED_EDGE, renderAnnotatedPhoto } from "@/lib/imaging/annotated-photo";
import type { LotReportPhoto } from "./lot-report-data";

export type ReportPhotoRow = {
  unitId: string;
  viewKey: string;
  previewKey: string | null;
  /** Upright size of the original, the space the regions are in. */
  width: number;
  height: number;
  regions: readonly { role: "defect" | "surface"; defect: string | null; shape: Shape }[];
};

export type ReportPhotoUnit = { serial: string | null; sampleIndex: number; grade: string | null };

export type AnnotateReportPhotosOptions = {
  /** The stored object's bytes, or null when it is gone (that photo is left out). */
  read: (key: string) => Promise<Buffer | null>;
  units: ReadonlyMap<string, ReportPhotoUnit>;
  classes: readonly { key: string; label: string }[];
  views: readonly { key: string; label: string }[];
  concurrency?: number;
};

export const reportPhotoConcurrency = () => Math.max(1, Math.min(4, availableParallelism()));

export const reportPhotoCaption = (unit: ReportPhotoUnit, view: string) => `Unit ${unit.serial ?? `#${unit.sampleIndex}`} · ${view}${unit.grade ? ` · grade ${unit.grade}` : ""}`;

export async function annotateReportPhotos(rows: readonly ReportPhotoRow[], options: AnnotateReportPhotosOptions): Promise<LotReportPhoto[]> {
  const { read, units, classes, views } = options;
  const drawn = await mapBounded(rows, options.concurrency ?? reportPhotoConcurrency(), async (photo): Promise<LotReportPhoto | null> => {
    const unit = units.get(photo.unitId);
    if (!photo.previewKey || !unit) return null;
    const image = await read(photo.previewKey);
    if (!image) return null;
    const caption = reportPhotoCaption(unit, views.find((v) => v.key === photo.viewKey)?.label ?? photo.viewKey);
    const rendered = await renderAnnotatedPhoto({
      image,
      regionSpace: { width: photo.width, height: photo.height },
      regions: photo.regions.filter((r) => r.role === "defect" && r.defect).map((r) => ({ defect: r.defect!, shape: r.shape })),
      surface: photo.regions.filter((r) => r.role === "surface").map((r) => r.shape),
      classes,
      caption,
      maxEdge: ANNOTATED_EDGE.report,
    });
    return { caption, jpeg: rendered.jpeg, width: rendered.width, height: rendered.height };
  });
  return drawn.filter((p): p is LotReportPhoto => p !== null);
}
