/**
 * Suggestions over HTTP: photos go through the real upload pipeline (so the preview and original
 * are in the test store), the server runs the imaging library and answers ghost shapes in the
 * original's pixels; nothing is stored. Expected positions are where the test drew the part and
 * the faults (hand-made images), with tolerances for the working-copy resolution.
 */
import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { partTypes, regionSets } from "@/db/schema";
import type { SuggestionResponse } from "@/lib/regions/suggestion-mapping";
import { createUnit, workspaceIdOf } from "../support/grading";
import { api, signIn, type Session } from "../support/http";
import { uploadPhoto } from "../support/photos";

type ErrorBody = { error: { code: string; message: string } };

let inspector: Session;
let owner: { workspaceId: string; userId: string };

beforeAll(async () => {
  inspector = await signIn("inspector@vellmoor.example");
  owner = await workspaceIdOf("lead@vellmoor.example");
});

async function displayUnit() {
  const t = crypto.randomBytes(4).toString("hex");
  const [partType] = await db()
    .insert(partTypes)
    .values({
      workspaceId: owner.workspaceId,
      slug: `suggest-${t}`,
      name: `Suggest display ${t}`,
      category: "display",
      views: [
        { key: "front", label: "Front", required: true, zones: [] },
        { key: "screen-white", label: "White screen", required: true, zones: [] },
      ],
      defectClasses: [
        { key: "scratch", label: "Scratch", severity: "minor" },
        { key: "pixel-lit", label: "Always-lit pixel", severity: "major" },
        { key: "pixel-dark", label: "Always-dark pixel", severity: "major" },
      ],
      checklist: [],
      panelResolution: { width: 1080, height: 2400 },
    })
    .returning();
  return createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
}

async function upload(unitId: string, bytes: Buffer, viewKey: string) {
  const { finalise } = await uploadPhoto(inspector, unitId, bytes, { viewKey });
  expect(finalise?.status, JSON.stringify(finalise?.body)).toBe(201);
  return finalise!.body.photo;
}

const suggest = (photoId: string, body: unknown) => api<SuggestionResponse & Partial<ErrorBody>>(inspector, "POST", `/api/photos/${photoId}/suggestions`, body);

describe("suggestions", () => {
  it("suggests the Surface found on the preview, scaled back to the original's pixels; stores nothing", async () => {
    const unit = await displayUnit();
    // 3200 × 2400 original → 2560 × 1920 preview (long edge 2560): a 1.25 scale to undo.
    const part = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: { r: 40, g: 42, b: 45 } } }).png().toBuffer();
    const jpeg = await sharp({ create: { width: 3200, height: 2400, channels: 3, background: { r: 222, g: 220, b: 214 } } }).composite([{ input: part, left: 800, top: 600 }]).jpeg({ quality: 90 }).toBuffer();
    const photo = await upload(unit.id, jpeg, "front");
    expect(photo.preview).toEqual({ width: 2560, height: 1920 });

    const res = await suggest(photo.id, { kind: "surface" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.ghosts).toHaveLength(1);
    const ghost = res.body.ghosts[0];
    expect(ghost.role).toBe("surface");
    const xs = ghost.shape.kind === "polygon" ? ghost.shape.points.map((p) => p[0]) : [];
    const ys = ghost.shape.kind === "polygon" ? ghost.shape.points.map((p) => p[1]) : [];
    // The part spans x 800–2400, y 600–1800 of the original; one working-copy pixel is 5 px here.
    for (const [got, want] of [[Math.min(...xs), 800], [Math.max(...xs), 2400], [Math.min(...ys), 600], [Math.max(...ys), 1800]]) expect(Math.abs(got - want)).toBeLessThanOrEqual(12);
    expect(ghost.label).toMatch(/Suggested Surface \(high confidence\)/);
    const [set] = await db().select().from(regionSets).where(eq(regionSets.photoId, photo.id));
    expect(set).toBeUndefined();
  });

  it("finds planted pixel faults on a screen view as Spots of their class, in original pixels", async () => {
    const unit = await displayUnit();
    const [w, h] = [1200, 900];
    const raw = Buffer.alloc(w * h * 3);
    let state = 12345;
    for (let i = 0; i < raw.length; i++) {
      state = (state * 1103515245 + 12345) >>> 0;
      raw[i] = 128 + ((state >>> 16) % 7) - 3;
    }
    const planted: { x: number; y: number; value: number }[] = [
      { x: 300, y: 200, value: 255 },
      { x: 900, y: 650, value: 0 },
    ];
    for (const p of planted) for (let dy = 0; dy < 2; dy++) for (let dx = 0; dx < 2; dx++) raw.fill(p.value, ((p.y + dy) * w + p.x + dx) * 3, ((p.y + dy) * w + p.x + dx) * 3 + 3);
    const jpeg = await sharp(raw, { raw: { width: w, height: h, channels: 3 } }).jpeg({ quality: 95, chromaSubsampling: "4:4:4" }).toBuffer();
    const screen = await upload(unit.id, jpeg, "screen-white");

    const res = await suggest(screen.id, { kind: "pixel-candidates" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const spots = res.body.ghosts.map((g) => ({ defect: g.role === "defect" ? g.defect : null, ...(g.shape.kind === "spot" ? g.shape : { x: NaN, y: NaN, radius: NaN }) }));
    // A 2 × 2 fault at (x, y) has its centre at (x + 1, y + 1) (pixel i spans [i, i + 1)).
    expect(spots.find((s) => Math.hypot(s.x - 301, s.y - 201) <= 1.5)).toMatchObject({ defect: "pixel-lit" });
    expect(spots.find((s) => Math.hypot(s.x - 901, s.y - 651) <= 1.5)).toMatchObject({ defect: "pixel-dark" });
    expect(spots.every((s) => s.radius >= 1)).toBe(true);
    expect(res.body.note).toMatch(/candidates? found/);
  });

  it("looks for pixel faults only on screen views, and refuses unknown kinds and fields", async () => {
    const unit = await displayUnit();
    const jpeg = await sharp({ create: { width: 80, height: 60, channels: 3, background: { r: 10, g: 200, b: crypto.randomInt(255) } } }).jpeg().toBuffer();
    const front = await upload(unit.id, jpeg, "front");
    const notScreen = await suggest(front.id, { kind: "pixel-candidates" });
    expect(notScreen.status).toBe(409);
    expect(notScreen.body.error?.message).toBe("Pixel faults are looked for only on the lit test-screen views (screen-…) of display parts.");
    expect((await suggest(front.id, { kind: "everything" })).body.error?.message).toMatch(/kind must be "surface" or "pixel-candidates"/);
    expect((await suggest(front.id, { kind: "surface", accept: true })).status).toBe(400);
    expect((await suggest("00000000-0000-4000-8000-000000000000", { kind: "surface" })).status).toBe(404);
  });
});
