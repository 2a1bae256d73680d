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
        // The display's active area, as the seeded display part type has it (0..1 of the Surface box).
        {
          key: "screen-white",
          label: "White screen",
          required: true,
          zones: [
            {
              id: "screen-active",
              label: "Screen active",
              polygon: [
                [0.04, 0.03],
                [0.96, 0.03],
                [0.96, 0.97],
                [0.04, 0.97],
              ],
            },
          ],
        },
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
    const part = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: { r: 40, g: 42, b: 45 } } })
      .png()
      .toBuffer();
    const jpeg = await sharp({ create: { width: 3200, height: 2400, channels: 3, background: { r: 222, g: 220, b: 214 } } })
      .composite([{ input: part, left: 800, top: 600 }])
      .jpeg({ quality: 90 })
      .toBuffer();
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
    for (const [got, want] of [
      [Math.min(...xs), 800],
      [Math.max(...xs), 2400],
      [Math.min(...ys), 600],
      [Math.max(...ys), 1800],
    ])
      expect(Math.abs(got - want)).toBeLessThanOrEqual(12);
    expect(ghost.label).toMatch(/Suggested Surface \(high confidence\)/);
    const [set] = await db().select().from(regionSets).where(eq(regionSets.photoId, photo.id));
    expect(set).toBeUndefined();
  });

  it("finds planted pixel faults only inside the active screen area, an edge band in from its edges", async () => {
    const unit = await displayUnit();
    // A photo of the lit panel: dark table (18), the device's body (38) at x 100–1100, y 80–820 =
    // the Surface, the lit panel (128 ± 3) with 40 px rounded corners at x 120–1080, y 90–810.
    // The zone is x 140–1060, y 102.2–797.8 (0.04–0.96 × 0.03–0.97 of the Surface box); the edge
    // band is max(16 px, 2 % of 695.6 px) = 16 px (lib/regions/screen-area.ts).
    const [w, h] = [1200, 900];
    const raw = Buffer.alloc(w * h * 3);
    const inRounded = (x: number, y: number) => {
      if (x < 120 || x >= 1080 || y < 90 || y >= 810) return false;
      const cx = Math.min(Math.max(x, 160), 1040);
      const cy = Math.min(Math.max(y, 130), 770);
      return Math.hypot(x - cx, y - cy) <= 40;
    };
    let state = 12345;
    for (let y = 0; y < h; y++) {
      for (let x = 0; x < w; x++) {
        const level = inRounded(x, y) ? 128 : x >= 100 && x < 1100 && y >= 80 && y < 820 ? 38 : 18;
        for (let c = 0; c < 3; c++) {
          state = (state * 1103515245 + 12345) >>> 0;
          raw[(y * w + x) * 3 + c] = level + ((state >>> 16) % 7) - 3;
        }
      }
    }
    const speck = (x: number, y: number, value: number) => {
      for (let dy = 0; dy < 2; dy++) for (let dx = 0; dx < 2; dx++) raw.fill(value, ((y + dy) * w + x + dx) * 3, ((y + dy) * w + x + dx) * 3 + 3);
    };
    speck(300, 200, 255); // inside: a lit pixel
    speck(900, 650, 0); // inside: a dark pixel
    speck(20, 20, 255); // the photo's corner
    speck(108, 400, 255); // the body, outside the panel
    speck(148, 400, 255); // inside the zone, 8 px from its edge: in the band
    const jpeg = await sharp(raw, { raw: { width: w, height: h, channels: 3 } })
      .jpeg({ quality: 95, chromaSubsampling: "4:4:4" })
      .toBuffer();
    const screen = await upload(unit.id, jpeg, "screen-white");

    const noSurface = await suggest(screen.id, { kind: "pixel-candidates" });
    expect(noSurface.status).toBe(409);
    expect(noSurface.body.error?.message).toMatch(/no Surface yet/);

    const surface = {
      id: "surface-1",
      shape: {
        kind: "polygon",
        points: [
          [100, 80],
          [1100, 80],
          [1100, 820],
          [100, 820],
        ],
      },
    };
    const saved = await api(inspector, "PUT", `/api/photos/${screen.id}/regions`, { baseVersion: 0, regions: { surfaces: [surface], regions: [], ruler: null } });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const res = await suggest(screen.id, { kind: "pixel-candidates" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const spots = res.body.ghosts.map((g) => ({ defect: g.role === "defect" ? g.defect : null, ...(g.shape.kind === "spot" ? g.shape : { x: NaN, y: NaN, radius: NaN }) }));
    // A 2 × 2 fault at (x, y) has its centre at (x + 1, y + 1) (pixel i spans [i, i + 1)).
    expect(spots).toHaveLength(2); // nothing at the photo's corner, on the body or in the band
    expect(spots.find((s) => Math.hypot(s.x - 301, s.y - 201) <= 1.5)).toMatchObject({ defect: "pixel-lit" });
    expect(spots.find((s) => Math.hypot(s.x - 901, s.y - 651) <= 1.5)).toMatchObject({ defect: "pixel-dark" });
    expect(spots.every((s) => s.radius >= 1)).toBe(true);
    expect(res.body.note).toMatch(/^2 candidates found inside the Surface and the zone Screen active, 16 px in from their edges\./);
  });

  it("looks for pixel faults only on screen views, and refuses unknown kinds and fields", async () => {
    const unit = await displayUnit();
    const jpeg = await sharp({ create: { width: 80, height: 60, channels: 3, background: { r: 10, g: 200, b: crypto.randomInt(255) } } })
      .jpeg()
      .toBuffer();
    const front = await upload(unit.id, jpeg, "front");
    const notScreen = await suggest(front.id, { kind: "pixel-candidates" });
    expect(notScreen.status).toBe(409);
    expect(notScreen.body.error?.message).toBe("Pixel faults are looked for only on the lit test-screen views (screen-…) of display parts.");
    expect((await suggest(front.id, { kind: "everything" })).body.error?.message).toMatch(/kind must be "surface" or "pixel-candidates"/);
    expect((await suggest(front.id, { kind: "surface", accept: true })).status).toBe(400);
    expect((await suggest("00000000-0000-4000-8000-000000000000", { kind: "surface" })).status).toBe(404);
  });
});
