/**
 * Demo photos: synthetic part photos (db/seed/photo-art.ts) for the units of the seeded lots, put
 * through the same pipeline as a browser upload — upload intent, PUT to the presigned URL,
 * finalise — and processed by the same function the worker's job runs (processPhoto, called
 * inline through finalise's "inline" dispatch, because the worker is not running yet while the
 * seed runs). A few JPEGs carry Exif orientations 6, 3 and 8, and one photo is uploaded to a
 * second unit, so the possible-reuse flag shows too.
 */
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { lots, partTypes, units, users, workspaces } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import type { Role } from "@/lib/auth/roles";
import { finaliseUpload } from "@/lib/photos/finalise";
import { createUploadIntent } from "@/lib/photos/intents";
import { asCameraJpeg, renderAnnotatedPartPhoto, type PlantedDefect, type PlantedRegion } from "./photo-art";
import type { Shape } from "@/lib/geometry/shape";

const MAX_UNITS_PER_LOT = 2;
const MAX_PHOTOS = 30;

/** Defects planted on the first (flawed) unit of a lot, by part kind and view; the second unit is clean. */
export function plantedDefects(kind: string, viewKey: string): PlantedDefect[] {
  const table: [RegExp, Record<string, PlantedDefect[]>][] = [
    [/camera/, { front: ["scratch", "dust"], lens: ["dust"], back: ["corrosion"], connector: [] }],
    [/battery/, { front: ["dent"], back: ["scratch", "swelling"], connector: ["torn-flex"] }],
    [/housing/, { front: ["crack", "scratch"], back: ["stain", "chip"] }],
    [/display/, { front: ["dead-pixel", "scratch"], "screen-white": ["dead-pixel"], "screen-black": ["stuck-pixel"], back: ["dent"], connector: [] }],
    [/flex/, { front: ["corrosion"], back: ["torn-flex"], connector: ["stain"] }],
    [/speaker/, { front: ["dust", "dent"], back: ["corrosion"], connector: [] }],
  ];
  const row = table.find(([pattern]) => pattern.test(kind));
  return row?.[1][viewKey] ?? ["scratch"];
}

type SeedUnit = { unitId: string; workspaceId: string; lotId: string; receivedOn: string; kind: string; views: { key: string }[] };

async function openUnits(lotIds?: string[]): Promise<SeedUnit[]> {
  return db()
    .select({
      unitId: units.id,
      workspaceId: units.workspaceId,
      lotId: units.lotId,
      receivedOn: lots.receivedOn,
      kind: sql<string>`${partTypes.slug} || ' ' || ${partTypes.category}`,
      views: partTypes.views,
    })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(inArray(units.status, ["queued", "on_bench"]), lotIds ? inArray(units.lotId, lotIds) : undefined))
    .orderBy(asc(lots.createdAt), asc(units.sampleIndex));
}

async function inspectorOf(workspaceId: string): Promise<SessionUser | null> {
  const [row] = await db()
    .select({ id: users.id, email: users.email, name: users.name, roles: users.roles, workspaceName: workspaces.name, timeZone: workspaces.timeZone })
    .from(users)
    .innerJoin(workspaces, eq(workspaces.id, users.workspaceId))
    .where(and(eq(users.workspaceId, workspaceId), eq(users.active, true), sql`'inspector' = ANY(${users.roles})`))
    .orderBy(asc(users.email))
    .limit(1);
  return row ? { ...row, workspaceId, roles: row.roles as Role[] } : null;
}

/** Intent → PUT → finalise, exactly the browser's steps. */
async function upload(actor: SessionUser, unitId: string, viewKey: string, fileName: string, bytes: Buffer) {
  const intent = await createUploadIntent(actor, unitId, { viewKey, fileName, contentType: "image/jpeg", bytes: bytes.length });
  const put = await fetch(intent.upload.url, { method: "PUT", headers: intent.upload.headers, body: new Uint8Array(bytes) });
  if (!put.ok) throw new Error(`the photo store refused the demo upload (${put.status})`);
  return finaliseUpload(actor, unitId, { ticket: intent.ticket }, { dispatch: "inline" });
}

/** A demo photo with what was planted on it (upright pixels): what the recheck demo marks as its regions (rechecks.ts). */
export type PlantedPhoto = { photoId: string; unitId: string; viewKey: string; surface: Shape; regions: PlantedRegion[] };

/** `lotIds` limits the seed to those lots (for its integration test); the demo seed photographs all. */
export async function seedPhotos({ lotIds }: { lotIds?: string[] } = {}): Promise<{ photos: number; units: number; reused: number; planted: PlantedPhoto[] }> {
  const candidates = await openUnits(lotIds);
  if (candidates.length === 0) {
    console.log("Demo photos: the seed has no open units of seeded lots yet, so no photos were created.");
    return { photos: 0, units: 0, reused: 0, planted: [] };
  }
  const perLot = new Map<string, SeedUnit[]>();
  for (const unit of candidates) {
    const list = perLot.get(unit.lotId) ?? [];
    if (list.length < MAX_UNITS_PER_LOT) perLot.set(unit.lotId, [...list, unit]);
  }
  const actors = new Map<string, SessionUser | null>();
  let count = 0;
  let orientationTurn = 0;
  const photographed = new Set<string>();
  const planted: PlantedPhoto[] = [];
  let firstClean: { workspaceId: string; unitId: string; viewKey: string; bytes: Buffer } | null = null;

  for (const lotUnits of perLot.values()) {
    for (const [index, unit] of lotUnits.entries()) {
      if (!actors.has(unit.workspaceId)) actors.set(unit.workspaceId, await inspectorOf(unit.workspaceId));
      const actor = actors.get(unit.workspaceId);
      if (!actor) continue;
      for (const [viewIndex, view] of unit.views.entries()) {
        if (count >= MAX_PHOTOS) break;
        const defects = index === 0 ? plantedDefects(unit.kind, view.key) : [];
        const annotated = await renderAnnotatedPartPhoto({ kind: unit.kind, viewKey: view.key, defects, seed: count * 7919 + 17 });
        const upright = annotated.jpeg;
        // Every fourth photo is shot with the phone held another way: 6, 3, 8 in turn.
        const orientation = count % 4 === 1 ? ([6, 3, 8] as const)[orientationTurn++ % 3] : 1;
        const capturedAt = new Date(`${unit.receivedOn}T08:30:00Z`);
        capturedAt.setUTCMinutes(30 + count * 3);
        const bytes = await asCameraJpeg(upright, { orientation, capturedAt, offset: "+01:00" });
        const stored = await upload(actor, unit.unitId, view.key, `IMG_${String(4100 + count).padStart(4, "0")}.jpg`, bytes);
        planted.push({ photoId: stored.photo.id, unitId: unit.unitId, viewKey: view.key, surface: annotated.surface, regions: annotated.regions });
        count++;
        photographed.add(unit.unitId);
        if (!firstClean && defects.length === 0 && viewIndex === 0) firstClean = { workspaceId: unit.workspaceId, unitId: unit.unitId, viewKey: view.key, bytes };
      }
    }
  }

  // The same clean photo handed in as evidence for a second unit: the app flags it.
  let reused = 0;
  const other = firstClean && candidates.find((u) => u.workspaceId === firstClean.workspaceId && u.unitId !== firstClean.unitId && u.views.some((v) => v.key === firstClean.viewKey));
  if (firstClean && other) {
    const result = await upload(actors.get(firstClean.workspaceId)!, other.unitId, firstClean.viewKey, "IMG_4999.jpg", firstClean.bytes);
    if (result.photo.possibleReuseOfPhotoId) reused++;
    count++;
    photographed.add(other.unitId);
  }
  console.log(`Demo photos: ${count} synthetic photos on ${photographed.size} units, processed through the upload pipeline (${reused} flagged as a possible reused photo).`);
  return { photos: count, units: photographed.size, reused, planted };
}
