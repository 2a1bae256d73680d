/**
 * Direct-database fixtures for grading tests: a part type, a rubric version, a lot with one unit,
 * ready photos and their region sets — the rows the Bench and intake would create. Written with
 * drizzle against the test server's own PostgreSQL (no mocks), in the tests/support/db.ts style.
 */
import crypto from "node:crypto";
import { eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { lots, partTypes, photos, regions, regionSets, rubricVersions, suppliers, units, users } from "@/db/schema";
import type { StoredSamplingPlan } from "@/db/schema/lots";
import type { Shape } from "@/lib/geometry/shape";
import type { RulerMark } from "@/lib/geometry/ruler";
import type { Rubric } from "@/lib/grading/rubric-schema";
import type { DefectClassDefinition, ViewDefinition } from "@/lib/part-types/schemas";

const hex = (n: number) => crypto.randomBytes(n).toString("hex");

/** A lens-style part: view "lens" whose zone "lens-window" is the left half of the Surface box. */
export const FIXTURE_VIEWS: ViewDefinition[] = [
  {
    key: "lens",
    label: "Lens",
    required: true,
    zones: [
      {
        id: "lens-window",
        label: "lens window",
        polygon: [
          [0, 0],
          [0.5, 0],
          [0.5, 1],
          [0, 1],
        ],
      },
    ],
  },
  {
    key: "back",
    label: "Back",
    required: false,
    zones: [
      {
        id: "body",
        label: "body",
        polygon: [
          [0, 0],
          [1, 0],
          [1, 1],
          [0, 1],
        ],
      },
    ],
  },
];
export const FIXTURE_DEFECTS: DefectClassDefinition[] = [
  { key: "scratch", label: "scratch", severity: "major" },
  { key: "dent", label: "dent", severity: "minor" },
  { key: "crack", label: "crack", severity: "critical" },
];

/** v1 of the fixture rubric: scratch on the lens window > 0.5 % → B, > 1 % → C. */
export const FIXTURE_RUBRIC_V1: Rubric = {
  rules: [
    { id: "lens-scratch-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" },
    { id: "lens-scratch-c", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 1, grade: "C" },
  ],
  notes: ["Test rubric."],
};

export async function workspaceIdOf(email: string): Promise<{ workspaceId: string; userId: string }> {
  const [row] = await db().select({ workspaceId: users.workspaceId, userId: users.id }).from(users).where(eq(users.email, email));
  if (!row) throw new Error(`No user ${email}`);
  return row;
}

export async function createPartType(workspaceId: string, name = `Fixture lens ${hex(3)}`) {
  const [row] = await db()
    .insert(partTypes)
    .values({ workspaceId, slug: `fixture-${hex(5)}`, name, category: "camera", views: FIXTURE_VIEWS, defectClasses: FIXTURE_DEFECTS, checklist: [], nominalSizeMm: { width: 20, height: 10 } })
    .returning();
  return row;
}

export async function insertRubricVersion(input: { workspaceId: string; partTypeId: string; version: number; status: "draft" | "published"; rubric?: Rubric; actorId?: string | null }) {
  const published = input.status === "published";
  const [row] = await db()
    .insert(rubricVersions)
    .values({
      workspaceId: input.workspaceId,
      partTypeId: input.partTypeId,
      version: input.version,
      status: input.status,
      rubric: input.rubric ?? FIXTURE_RUBRIC_V1,
      basedOnVersion: input.version > 1 ? input.version - 1 : null,
      createdBy: input.actorId ?? null,
      publishedBy: published ? (input.actorId ?? null) : null,
      publishedAt: published ? new Date() : null,
    })
    .returning();
  return row;
}

const PLAN: StoredSamplingPlan = {
  standard: "ISO 2859-1 single sampling",
  lotSize: 10,
  level: "II",
  severity: "normal",
  sampleSize: 1,
  hundredPercent: false,
  byDefectSeverity: {
    critical: { aql: null, codeLetter: "B", planLetter: "B", sampleSize: 1, accept: 0, reject: 1 },
    major: { aql: 1, codeLetter: "B", planLetter: "B", sampleSize: 1, accept: 0, reject: 1 },
    minor: { aql: 4, codeLetter: "B", planLetter: "B", sampleSize: 1, accept: 0, reject: 1 },
  },
  switchingReason: "Fixture.",
};

/** A lot of the part type with one unit on the bench; returns the unit. */
export async function createUnit(input: { workspaceId: string; partTypeId: string; createdBy: string }) {
  const [supplier] = await db()
    .insert(suppliers)
    .values({ workspaceId: input.workspaceId, name: `Fixture Supplier ${hex(4)}`, contactEmail: "fixture@supplier.example" })
    .returning();
  const [lot] = await db()
    .insert(lots)
    .values({
      workspaceId: input.workspaceId,
      supplierId: supplier.id,
      partTypeId: input.partTypeId,
      purchaseRef: `PO-${hex(3)}`,
      quantity: 10,
      receivedOn: "2026-12-01",
      dueOn: "2026-12-08",
      inspectionLevel: "II",
      aqlMajor: 1,
      aqlMinor: 4,
      inspectionSeverity: "normal",
      plan: PLAN,
      createdBy: input.createdBy,
    })
    .returning();
  const [unit] = await db()
    .insert(units)
    .values({
      workspaceId: input.workspaceId,
      lotId: lot.id,
      sampleIndex: 1,
      serial: `SN-${hex(4)}`,
      status: "on_bench",
      partTypeId: input.partTypeId,
      supplierId: supplier.id,
      lotDueOn: lot.dueOn,
      lotReceivedOn: lot.receivedOn,
      lotCreatedAt: lot.createdAt,
    })
    .returning();
  return unit;
}

/** A processed ("ready") photo of the unit; its objects are never read by measuring. */
export async function createPhoto(input: { workspaceId: string; unitId: string; uploadedBy: string; viewKey?: string; width?: number; height?: number; status?: "ready" | "processing" }) {
  const id = crypto.randomUUID();
  const ready = (input.status ?? "ready") === "ready";
  const [row] = await db()
    .insert(photos)
    .values({
      id,
      workspaceId: input.workspaceId,
      unitId: input.unitId,
      viewKey: input.viewKey ?? "lens",
      status: input.status ?? "ready",
      originalKey: `fixtures/${id}/original.jpg`,
      previewKey: ready ? `fixtures/${id}/preview.webp` : null,
      thumbnailKey: ready ? `fixtures/${id}/thumb.webp` : null,
      contentType: "image/jpeg",
      fileName: "fixture.jpg",
      bytes: 1000,
      sha256: hex(32),
      format: ready ? "jpeg" : null,
      width: ready ? (input.width ?? 300) : null,
      height: ready ? (input.height ?? 200) : null,
      uploadedBy: input.uploadedBy,
    })
    .returning();
  return row;
}

export type FixtureRegion =
  { clientId: string; role: "defect"; defect: string; shape: Shape } | { clientId: string; role: "surface"; shape: Shape } | { clientId: string; role: "ruler"; ruler: RulerMark };

/** Saves a photo's whole region set as the Bench would: version + 1, rows replaced. */
export async function saveRegions(input: { workspaceId: string; photoId: string; authorId: string; regions: FixtureRegion[] }) {
  return db().transaction(async (tx) => {
    const [set] = await tx
      .insert(regionSets)
      .values({ photoId: input.photoId, workspaceId: input.workspaceId, version: 1, updatedBy: input.authorId })
      .onConflictDoUpdate({ target: regionSets.photoId, set: { version: sql`${regionSets.version} + 1`, updatedAt: new Date(), updatedBy: input.authorId } })
      .returning();
    await tx.delete(regions).where(eq(regions.photoId, input.photoId));
    if (input.regions.length > 0) {
      await tx.insert(regions).values(
        input.regions.map((r) => ({
          workspaceId: input.workspaceId,
          photoId: input.photoId,
          clientId: r.clientId,
          role: r.role,
          defectClass: r.role === "defect" ? r.defect : null,
          shape: r.role === "ruler" ? null : r.shape,
          ruler: r.role === "ruler" ? r.ruler : null,
          authorId: input.authorId,
          versionWritten: set.version,
        })),
      );
    }
    return set.version;
  });
}

/** The Surface used throughout: 200 × 100 px at (50, 50) (20 × 10 mm nominal → 10 px/mm). */
export const FIXTURE_SURFACE: FixtureRegion = {
  clientId: "surface-1",
  role: "surface",
  shape: {
    kind: "polygon",
    points: [
      [50, 50],
      [250, 50],
      [250, 150],
      [50, 150],
    ],
  },
};
/** A scratch box of w × h px inside the lens window (the Surface's left half, 10 000 px). */
export const scratchBox = (w: number, h: number, clientId = "scratch-1"): FixtureRegion => ({
  clientId,
  role: "defect",
  defect: "scratch",
  shape: { kind: "rect", x: 60, y: 60, width: w, height: h },
});

/** A graded-unit scene: part type with published v1 (and optionally a draft), one photo with regions. */
export async function createMeasurableUnit(owner: { workspaceId: string; userId: string }, options: { regions?: FixtureRegion[]; draft?: boolean } = {}) {
  const partType = await createPartType(owner.workspaceId);
  const v1 = await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 1, status: "published", actorId: owner.userId });
  if (options.draft) await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 2, status: "draft", actorId: owner.userId });
  const unit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId });
  // 12 × 10 px = 120 px of the 10 000 px lens window = 1.2 % → C under v1.
  await saveRegions({ workspaceId: owner.workspaceId, photoId: photo.id, authorId: owner.userId, regions: options.regions ?? [FIXTURE_SURFACE, scratchBox(12, 10)] });
  return { partType, v1, unit, photo };
}
