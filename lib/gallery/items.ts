import "server-only";
/**
 * Reading the Gallery: the filtered list (keyset pages), one item, and the Bench's reference
 * panel. Anyone in the workspace reads published items; drafts and retired items are for editors
 * only and answer 404 to anyone else (lib/gallery/access.ts), like an item of another workspace.
 * The items of a calibration set someone is assigned and has not submitted are kept from them the
 * same way (the set's key; db/queries/gallery.ts notKeyFor).
 */
import { getGalleryItem, getSourceUnitLabel, listGalleryCards, listReferenceItems, type GalleryListFilters } from "@/db/queries/gallery";
import { getGradingPartType } from "@/db/queries/rubrics";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { canEditGallery, canOpenItem, hidesUnitsAwaitingRecheck } from "./access";
import { decodeGalleryCursor, encodeGalleryCursor } from "./cursor";
import { toGalleryCardDto, toGalleryItemDto, type GalleryCardDto, type GalleryItemDto } from "./dto";
import type { GalleryStatus } from "./rules";
import type { GalleryListQuery, ReferenceQuery } from "./schemas";

type Reader = Pick<SessionUser, "id" | "workspaceId" | "roles">;

export const ITEM_NOT_FOUND = "That gallery item";

/** Which statuses a list shows: published for readers; editors choose (default draft + published). */
export function listedStatuses(reader: Reader, status: GalleryListQuery["status"]): GalleryStatus[] {
  if (!canEditGallery(reader.roles)) return ["published"];
  if (!status || status === "all") return ["draft", "published"];
  return [status];
}

export type GalleryPage = { items: GalleryCardDto[]; nextCursor: string | null };

/**
 * A page of the list as the API answers it, as JSON text ({ items, nextCursor }, a GalleryPage):
 * the cards come as JSON from PostgreSQL (db/queries/gallery.ts galleryCardJson, the shape of
 * toGalleryCardDto) and are joined here without being parsed and written out again.
 */
export async function listGalleryJson(reader: Reader, query: GalleryListQuery): Promise<string> {
  const filters: GalleryListFilters = {
    statuses: listedStatuses(reader, query.status),
    partTypeId: query.partType,
    viewKey: query.view,
    defectClass: query.defect,
    kind: query.kind,
    grade: query.grade,
    hideUnitsAwaitingRecheck: hidesUnitsAwaitingRecheck(reader.roles),
  };
  const after = query.cursor ? decodeGalleryCursor(query.cursor) : undefined;
  const rows = await listGalleryCards({ workspaceId: reader.workspaceId, readerId: reader.id, filters, after, limit: query.limit });
  const page = rows.slice(0, query.limit);
  const last = page.at(-1);
  const nextCursor = rows.length > query.limit && last ? encodeGalleryCursor({ createdAt: last.cursorAt, id: last.id }) : null;
  return `{"items":[${page.map((row) => row.card).join(",")}],"nextCursor":${JSON.stringify(nextCursor)}}`;
}

/** The same page as objects, for the server-rendered screens. */
export async function listGallery(reader: Reader, query: GalleryListQuery): Promise<GalleryPage> {
  return JSON.parse(await listGalleryJson(reader, query)) as GalleryPage;
}

/** The item as its page shows it; 404 when the reader may not see it. */
export async function readGalleryItem(reader: Reader, itemId: string): Promise<GalleryItemDto> {
  const row = await getGalleryItem({ workspaceId: reader.workspaceId, itemId, readerId: reader.id });
  if (!row || !canOpenItem(reader.roles, row)) throw notFound(ITEM_NOT_FOUND);
  const source = row.sourceUnitId ? await getSourceUnitLabel({ workspaceId: reader.workspaceId, unitId: row.sourceUnitId }) : null;
  const label = source ? (source.serial ? `${source.serial} (${source.purchaseRef})` : `Sample ${source.sampleIndex} of ${source.purchaseRef}`) : null;
  return toGalleryItemDto(row, label);
}

/** At most this many examples beside the photo being marked: enough to compare, few enough to scan. */
export const REFERENCE_LIMIT = 24;

/** Published items of the unit's part type and this view, narrowed to a class, in the panel's order. */
export async function listReference(reader: Reader, query: ReferenceQuery): Promise<GalleryCardDto[]> {
  const partType = await getGradingPartType({ workspaceId: reader.workspaceId, partTypeId: query.partType });
  if (!partType) throw notFound("That part type");
  if (!partType.views.some((v) => v.key === query.view)) {
    throw new AppError("bad_request", `“${query.view}” is not a view of ${partType.name}.`, { fieldErrors: { view: "is not a view of this part type" } });
  }
  const rows = await listReferenceItems({
    workspaceId: reader.workspaceId,
    readerId: reader.id,
    partTypeId: query.partType,
    viewKey: query.view,
    defectClass: query.defect,
    limit: REFERENCE_LIMIT,
    hideUnitsAwaitingRecheck: hidesUnitsAwaitingRecheck(reader.roles),
  });
  return rows.map(toGalleryCardDto);
}
