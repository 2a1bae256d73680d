/**
 * Between a photo's region-set payload (lib/geometry/validate.ts, what the Bench sends and gets)
 * and the rows of the `regions` table. Pure, so the save logic can be tested without a database.
 *
 * Decisions:
 * - Drawing order is kept in `position`: surfaces first, then defect regions in payload order,
 *   then the ruler — the same order regionsFromPayload (lib/annotate/serialise.ts) rebuilds, so a
 *   save followed by a load gives the editor back exactly what it had.
 * - A save replaces every row, but a region whose content did not change keeps its author and
 *   the version that last changed it (provenance for rechecks and disputes); changed and new
 *   regions get the saver and the new version.
 */
import type { RegionRole } from "@/db/schema/regions";
import type { RulerMark } from "@/lib/geometry/ruler";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
import type { RegionSetPayload } from "@/lib/geometry/validate";

/** What a stored region row holds, as far as the payload is concerned. */
export type StoredRegion = {
  clientId: string;
  role: RegionRole;
  defectClass: string | null;
  shape: Shape | null;
  ruler: RulerMark | null;
  authorId: string;
  versionWritten: number;
  position: number;
};

/** JSON with object keys sorted, so two equal values give equal text (jsonb reorders keys). */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (value !== null && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  return JSON.stringify(value);
}

/** True when two payloads hold the same regions in the same order. */
export function samePayload(a: RegionSetPayload, b: RegionSetPayload): boolean {
  return canonicalJson(a) === canonicalJson(b);
}

export const EMPTY_PAYLOAD: RegionSetPayload = { regions: [], surfaces: [], ruler: null };

/** Rows (any order) to the payload, in drawing order. */
export function payloadFromRows(rows: readonly StoredRegion[]): RegionSetPayload {
  const ordered = [...rows].sort((a, b) => a.position - b.position || (a.clientId < b.clientId ? -1 : a.clientId > b.clientId ? 1 : 0));
  const payload: RegionSetPayload = { regions: [], surfaces: [], ruler: null };
  for (const row of ordered) {
    if (row.role === "defect" && row.shape && row.defectClass) payload.regions.push({ id: row.clientId, defect: row.defectClass, shape: row.shape });
    else if (row.role === "surface" && row.shape?.kind === "polygon") payload.surfaces.push({ id: row.clientId, shape: row.shape as PolygonShape });
    else if (row.role === "ruler" && row.ruler) payload.ruler = { id: row.clientId, ...row.ruler };
  }
  return payload;
}

type Content = Pick<StoredRegion, "clientId" | "role" | "defectClass" | "shape" | "ruler">;

/** The payload as row contents, in drawing order (position = index). */
export function contentsOfPayload(payload: RegionSetPayload): Content[] {
  const contents: Content[] = [
    ...payload.surfaces.map((s): Content => ({ clientId: s.id, role: "surface", defectClass: null, shape: s.shape, ruler: null })),
    ...payload.regions.map((r): Content => ({ clientId: r.id, role: "defect", defectClass: r.defect, shape: r.shape, ruler: null })),
  ];
  if (payload.ruler) {
    const { id, ...ruler } = payload.ruler;
    contents.push({ clientId: id, role: "ruler", defectClass: null, shape: null, ruler });
  }
  return contents;
}

const contentKey = (c: Content) => canonicalJson({ role: c.role, defectClass: c.defectClass, shape: c.shape, ruler: c.ruler });

/**
 * The rows a save writes: every region of `payload`, unchanged ones with their earlier author
 * and version, the others with `authorId` and `version`. Also counts what changed, for the log.
 */
export function rowsForSave(payload: RegionSetPayload, previous: readonly StoredRegion[], { authorId, version }: { authorId: string; version: number }) {
  const before = new Map(previous.map((row) => [row.clientId, row]));
  let added = 0;
  let changed = 0;
  const rows: StoredRegion[] = contentsOfPayload(payload).map((content, position) => {
    const earlier = before.get(content.clientId);
    const same = earlier !== undefined && contentKey(earlier) === contentKey(content);
    if (!earlier) added++;
    else if (!same) changed++;
    return {
      ...content,
      authorId: same ? earlier.authorId : authorId,
      versionWritten: same ? earlier.versionWritten : version,
      position,
    };
  });
  const kept = new Set(rows.map((r) => r.clientId));
  const removed = previous.filter((row) => !kept.has(row.clientId)).length;
  return { rows, added, changed, removed };
}
