/**
 * Gallery fixtures: a graded unit whose photo can be promoted (measured and graded through the
 * real API, like tests/support/grading-access.ts), and gallery item rows written directly for
 * lists and filters. The same PostgreSQL the app uses; no mocks.
 */
import { db } from "@/db/client";
import { galleryItems, type NewGalleryItemRow } from "@/db/schema";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { createMeasurableUnit, createPhoto, workspaceIdOf } from "./grading";
import { api, type Session } from "./http";

export type Owner = { workspaceId: string; userId: string };

/**
 * A unit graded C under the fixture rubric v1 (a 12 × 10 px scratch on the lens window, 1.2 %),
 * with its ready photo; `extraPhotos` more ready photos of the same unit for direct item rows.
 */
export async function createGradedPhoto(lead: Session, { extraPhotos = 0 } = {}) {
  const owner = await workspaceIdOf(lead.email);
  const scene = await createMeasurableUnit(owner);
  const measured = await api(lead, "POST", `/api/units/${scene.unit.id}/measure`);
  if (measured.status !== 200) throw new Error(`Fixture measure failed: ${JSON.stringify(measured.body)}`);
  const graded = await api(lead, "POST", `/api/units/${scene.unit.id}/grades`, { decision: "accept" });
  if (graded.status !== 201) throw new Error(`Fixture grade failed: ${JSON.stringify(graded.body)}`);
  const extra = [];
  for (let i = 0; i < extraPhotos; i++) extra.push(await createPhoto({ workspaceId: owner.workspaceId, unitId: scene.unit.id, uploadedBy: owner.userId }));
  return { owner, ...scene, extra };
}

export const EMPTY_REGIONS: RegionSetPayload = { regions: [], surfaces: [], ruler: null };
export const SCRATCHED: RegionSetPayload = {
  regions: [{ id: "s1", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 12, height: 10 } }],
  surfaces: [
    {
      id: "surface-1",
      shape: {
        kind: "polygon",
        points: [
          [50, 50],
          [250, 50],
          [250, 150],
          [50, 150],
        ],
      },
    },
  ],
  ruler: null,
};

/** An item row as the app would have written it (status fields kept consistent). */
export async function insertItem(owner: Owner, fields: Pick<NewGalleryItemRow, "partTypeId" | "photoId"> & Partial<NewGalleryItemRow>) {
  const status = fields.status ?? "draft";
  const regions = fields.regions ?? EMPTY_REGIONS;
  const [row] = await db()
    .insert(galleryItems)
    .values({
      workspaceId: owner.workspaceId,
      viewKey: "lens",
      kind: regions.regions.length ? "abnormal" : "normal",
      grade: regions.regions.length ? "C" : "A",
      createdBy: owner.userId,
      caption: status === "draft" ? "" : "Fixture caption",
      ...fields,
      regions,
      defectClasses: [...new Set(regions.regions.map((r) => r.defect))].sort(),
      status,
      publishedAt: status === "draft" ? null : new Date(),
      retiredAt: status === "retired" ? new Date() : null,
    })
    .returning();
  return row;
}
