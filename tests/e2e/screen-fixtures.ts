/**
 * Browser-test fixtures for pixel-fault suggestions: a display part type whose lit test-screen
 * view has the active-screen zone (as the seeded display has it), a unit on the inspector's bench
 * (plain pg, as the other e2e fixtures), and a photo of a lit panel with rounded corners on the
 * device body on a dark table, with specks planted inside and outside the active area.
 */
import crypto from "node:crypto";
import sharp from "sharp";
import { fixturePlan, testDb } from "./db";

const VIEWS = [
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
];
const DEFECTS = [
  { key: "scratch", label: "Scratch", severity: "minor" },
  { key: "pixel-lit", label: "Always-lit pixel", severity: "major" },
  { key: "pixel-dark", label: "Always-dark pixel", severity: "major" },
];

export async function createScreenBenchUnit(holderEmail = "inspector@vellmoor.example") {
  const db = testDb();
  const t = crypto.randomBytes(4).toString("hex");
  const one = async <T>(text: string, values: unknown[]) => (await db.query(text, values)).rows[0] as T;
  const lead = await one<{ id: string; workspace_id: string }>("SELECT id, workspace_id FROM users WHERE email = 'lead@vellmoor.example'", []);
  const holder = await one<{ id: string }>("SELECT id FROM users WHERE email = $1", [holderEmail]);
  const ws = lead.workspace_id;
  const partType = await one<{ id: string }>(
    `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist, panel_resolution) VALUES ($1, $2, $3, 'display', $4, $5, '[]', '{"width":1080,"height":2400}') RETURNING id`,
    [ws, `e2e-screen-${t}`, `E2E screen ${t}`, JSON.stringify(VIEWS), JSON.stringify(DEFECTS)],
  );
  const supplier = await one<{ id: string }>("INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, $2, 'screen@supplier.example') RETURNING id", [ws, `E2E screen supplier ${t}`]);
  const plan = fixturePlan(1);
  const lot = await one<{ id: string; created_at: Date }>(
    `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
     VALUES ($1, $2, $3, $4, 1, '2026-11-30', '2099-12-31', 'II', 1, 2.5, 'normal', $5, $6) RETURNING id, created_at`,
    [ws, supplier.id, partType.id, `PO-E2E-SCREEN-${t}`, JSON.stringify(plan), lead.id],
  );
  const unit = await one<{ id: string }>(
    `INSERT INTO units (workspace_id, lot_id, sample_index, serial, status, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at, lease_holder_id, lease_expires_at, claimed_at)
     VALUES ($1, $2, 1, $3, 'on_bench', $4, $5, '2099-12-31', '2026-11-30', $6, $7, now() + interval '20 minutes', now()) RETURNING id`,
    [ws, lot.id, `SCR-${t.toUpperCase()}`, partType.id, supplier.id, lot.created_at, holder.id],
  );
  return { unitId: unit.id };
}

/**
 * 1600 × 1200: table 18, body (the Surface) x 130–1470, y 100–1100 at 38, the lit panel (128)
 * x 160–1440, y 115–1085 with 50 px rounded corners; noise ± 3. The zone is then x 183.6–1416.4,
 * y 130–1070 and the band max(16, 2 % of 940) = 19 px. Planted 2 × 2 specks: a lit and a dark
 * pixel inside; lit ones on the table's corner, on the body, and 10 px inside the zone's edge.
 */
export const SCREEN_SURFACE: [number, number][] = [
  [130, 100],
  [1470, 100],
  [1470, 1100],
  [130, 1100],
];
export const SCREEN_INSIDE = [
  { x: 500, y: 400, kind: "pixel-lit" },
  { x: 1100, y: 800, kind: "pixel-dark" },
];

export async function screenPhoto(): Promise<Buffer> {
  const [w, h] = [1600, 1200];
  const raw = Buffer.alloc(w * h * 3);
  const inPanel = (x: number, y: number) => {
    if (x < 160 || x >= 1440 || y < 115 || y >= 1085) return false;
    const cx = Math.min(Math.max(x, 210), 1390);
    const cy = Math.min(Math.max(y, 165), 1035);
    return Math.hypot(x - cx, y - cy) <= 50;
  };
  let state = 777;
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const level = inPanel(x, y) ? 128 : x >= 130 && x < 1470 && y >= 100 && y < 1100 ? 38 : 18;
      for (let c = 0; c < 3; c++) {
        state = (state * 1103515245 + 12345) >>> 0;
        raw[(y * w + x) * 3 + c] = level + ((state >>> 16) % 7) - 3;
      }
    }
  }
  const speck = (x: number, y: number, value: number) => {
    for (let dy = 0; dy < 2; dy++) for (let dx = 0; dx < 2; dx++) raw.fill(value, ((y + dy) * w + x + dx) * 3, ((y + dy) * w + x + dx) * 3 + 3);
  };
  speck(500, 400, 255);
  speck(1100, 800, 0);
  speck(12, 12, 255);
  speck(140, 600, 255);
  speck(194, 600, 255);
  return sharp(raw, { raw: { width: w, height: h, channels: 3 } })
    .jpeg({ quality: 95, chromaSubsampling: "4:4:4" })
    .toBuffer();
}
