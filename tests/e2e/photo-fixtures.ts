/**
 * Browser-test fixtures for photo intake: a unit on the bench with camera-module views (plain pg,
 * so the app's server-only modules stay out), and generated photos whose upright picture is known.
 */
import crypto from "node:crypto";
import pg from "pg";
import sharp from "sharp";
import { fixturePlan } from "./db";
import { asCameraJpeg } from "@/db/seed/photo-art";

let pool: pg.Pool | null = null;
const db = () => (pool ??= new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 }));

export const E2E_VIEWS = [
  { key: "front", label: "Front", required: true, zones: [] },
  { key: "back", label: "Back", required: true, zones: [] },
  { key: "lens", label: "Lens", required: true, zones: [] },
  { key: "connector", label: "Connector", required: false, zones: [] },
];

/** A camera-module part type, a lot (due far ahead, so no queue test meets it) and one unit on the bench. */
export async function createPhotoBenchUnit(): Promise<string> {
  if (!process.env.DATABASE_URL) throw new Error("DATABASE_URL is not set; run browser tests through `npm test`.");
  const t = crypto.randomBytes(4).toString("hex");
  const { rows: ws } = await db().query("SELECT w.id, u.id AS lead FROM workspaces w JOIN users u ON u.workspace_id = w.id WHERE w.slug = 'vellmoor' AND u.email = 'lead@vellmoor.example'");
  const { rows: pt } = await db().query("INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist) VALUES ($1, $2, $3, 'camera', $4, '[]', '[]') RETURNING id", [
    ws[0].id,
    `e2e-photo-${t}`,
    `E2E camera module ${t}`,
    JSON.stringify(E2E_VIEWS),
  ]);
  const { rows: sup } = await db().query("INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, $2, 'e2e@supplier.example') RETURNING id", [ws[0].id, `E2E photo supplier ${t}`]);
  const plan = fixturePlan(1);
  const { rows: lot } = await db().query(
    `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
     VALUES ($1, $2, $3, $4, 1, '2026-11-30', '2099-12-31', 'II', 1, 2.5, 'normal', $5, $6) RETURNING id, created_at`,
    [ws[0].id, sup[0].id, pt[0].id, `PO-E2E-PHOTO-${t}`, JSON.stringify(plan), ws[0].lead],
  );
  const { rows: unit } = await db().query(
    `INSERT INTO units (workspace_id, lot_id, sample_index, serial, status, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at)
     VALUES ($1, $2, 1, $3, 'on_bench', $4, $5, '2099-12-31', '2026-11-30', $6) RETURNING id`,
    [ws[0].id, lot[0].id, `CAM-${t}`, pt[0].id, sup[0].id, lot[0].created_at],
  );
  return unit[0].id as string;
}

export type Rgb = readonly [number, number, number];
/** Upright quadrant colours: top-left, top-right, bottom-left, bottom-right. */
export const QUADRANTS: Record<"topLeft" | "topRight" | "bottomLeft" | "bottomRight", Rgb> = {
  topLeft: [220, 30, 30],
  topRight: [30, 200, 30],
  bottomLeft: [30, 30, 220],
  bottomRight: [230, 220, 30],
};

/**
 * An upright 1200 × 900 picture (a colour per quadrant, noise so it compresses like a photo, and
 * a grey marker band whose position makes every file's bytes unique), stored as a camera held
 * for Exif orientation `orientation` would store it.
 */
export async function orientedPhoto(index: number, orientation: 1 | 3 | 6 | 8): Promise<Buffer> {
  const [w, h] = [1200, 900];
  const raw = Buffer.alloc(w * h * 3);
  let state = index * 2654435761 + 1;
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const base = y < h / 2 ? (x < w / 2 ? QUADRANTS.topLeft : QUADRANTS.topRight) : x < w / 2 ? QUADRANTS.bottomLeft : QUADRANTS.bottomRight;
      state = (state * 1103515245 + 12345) >>> 0;
      const noise = ((state >>> 16) % 17) - 8;
      const marker = Math.abs(x - (100 + index * 90)) < 6 && y > h * 0.4 && y < h * 0.6;
      const i = (y * w + x) * 3;
      for (let c = 0; c < 3; c++) raw[i + c] = Math.max(0, Math.min(255, (marker ? 128 : base[c]) + noise));
    }
  }
  const upright = await sharp(raw, { raw: { width: w, height: h, channels: 3 } })
    .jpeg({ quality: 92 })
    .toBuffer();
  return asCameraJpeg(upright, { orientation, capturedAt: new Date("2026-11-30T09:00:00Z"), offset: "+01:00" });
}

/** The colour nearest to a pixel among the four quadrant colours. */
export function nearestQuadrant(rgb: number[]): keyof typeof QUADRANTS {
  let best: keyof typeof QUADRANTS = "topLeft";
  let bestDistance = Infinity;
  for (const [name, ref] of Object.entries(QUADRANTS) as [keyof typeof QUADRANTS, Rgb][]) {
    const d = ref.reduce((sum, v, k) => sum + (v - rgb[k]) ** 2, 0);
    if (d < bestDistance) [best, bestDistance] = [name, d];
  }
  return best;
}
