/**
 * What the Gallery API says about an item, shared by the route handlers, the server pages and the
 * client components (one definition; rows go through these functions, never through a cast).
 * Images are reached through /api/photos/:id/{thumbnail,preview}, which check the session.
 */
import type { GalleryCardRow, GalleryItemDetailRow } from "@/db/queries/gallery";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { GalleryKind, GalleryStatus } from "./rules";

type Size = { width: number; height: number };

export type GalleryCardDto = {
  id: string;
  status: GalleryStatus;
  kind: GalleryKind;
  partType: { id: string; name: string };
  viewKey: string;
  grade: Grade;
  defectClasses: string[];
  caption: string;
  /** The item's own regions (upright original pixels), drawn over the thumbnail. */
  regions: RegionSetPayload;
  revision: number;
  createdAt: string;
  updatedAt: string;
  photo: { id: string; ready: boolean; original: Size | null; preview: Size | null; thumbnail: Size | null; urls: { thumbnail: string; preview: string } | null };
};

export type GalleryItemDto = GalleryCardDto & {
  rubricVersion: number | null;
  source: { kind: "unit"; unitId: string; label: string } | { kind: "upload" };
  createdByName: string;
  publishedAt: string | null;
  retiredAt: string | null;
};

const size = (width: number | null, height: number | null): Size | null => (width !== null && height !== null ? { width, height } : null);

export function toGalleryCardDto(row: GalleryCardRow): GalleryCardDto {
  const ready = row.photo.status === "ready";
  return {
    id: row.id,
    status: row.status,
    kind: row.kind,
    partType: { id: row.partTypeId, name: row.partTypeName },
    viewKey: row.viewKey,
    grade: row.grade,
    defectClasses: row.defectClasses,
    caption: row.caption,
    regions: row.regions,
    revision: row.revision,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    photo: {
      id: row.photo.id,
      ready,
      original: size(row.photo.width, row.photo.height),
      preview: size(row.photo.previewWidth, row.photo.previewHeight),
      thumbnail: size(row.photo.thumbnailWidth, row.photo.thumbnailHeight),
      urls: ready ? { thumbnail: `/api/photos/${row.photo.id}/thumbnail`, preview: `/api/photos/${row.photo.id}/preview` } : null,
    },
  };
}

export function toGalleryItemDto(row: GalleryItemDetailRow, sourceLabel: string | null): GalleryItemDto {
  return {
    ...toGalleryCardDto(row),
    rubricVersion: row.rubricVersion ?? null,
    source: row.sourceUnitId ? { kind: "unit", unitId: row.sourceUnitId, label: sourceLabel ?? "a unit" } : { kind: "upload" },
    createdByName: row.createdByName,
    publishedAt: row.publishedAt?.toISOString() ?? null,
    retiredAt: row.retiredAt?.toISOString() ?? null,
  };
}
