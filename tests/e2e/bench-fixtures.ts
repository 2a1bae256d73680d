/**
 * Browser-test fixtures for the Bench: a lens-like part type with zones, defect classes and a
 * published rubric, a lot and one unit on the inspector's bench (plain pg, as the other e2e
 * fixtures; the app's modules are server-only), and photos uploaded through the real API steps
 * (intent → PUT to the store → finalise) so the worker makes the preview the canvas draws.
 */
import crypto from "node:crypto";
import type { APIRequestContext } from "@playwright/test";
import pg from "pg";
import sharp from "sharp";
import { fixturePlan } from "./db";

let pool: pg.Pool | null = null;
const db = () => (pool ??= new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 }));

export const BENCH_VIEWS = [
  {
    key: "front",
    label: "Front",
    required: true,
    zones: [
      {
        id: "lens-window",
        label: "Lens window",
        polygon: [
          [0, 0],
          [0.5, 0],
          [0.5, 1],
          [0, 1],
        ],
      },
    ],
  },
  { key: "back", label: "Back", required: true, zones: [] },
];
export const BENCH_DEFECTS = [
  { key: "scratch", label: "Scratch", severity: "major" },
  { key: "dent", label: "Dent", severity: "minor" },
  { key: "crack", label: "Crack", severity: "critical" },
];
const RUBRIC = {
  rules: [
    { id: "lens-scratch-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" },
    { id: "dent-count-b", metric: "count", defect: "dent", comparison: ">", threshold: 2, grade: "B" },
  ],
};

/** A unit on `holderEmail`'s bench (lease running 20 min), in a lot due far ahead so no queue test meets it. */
export async function createBenchUnit(holderEmail = "inspector@vellmoor.example", { queuedSibling = false } = {}) {
  if (!process.env.DATABASE_URL) throw new Error("DATABASE_URL is not set; run browser tests through `npm test`.");
  const t = crypto.randomBytes(4).toString("hex");
  const q = async <T extends pg.QueryResultRow>(text: string, values: unknown[]) => (await db().query<T>(text, values)).rows[0];
  const lead = await q<{ id: string; workspace_id: string }>("SELECT id, workspace_id FROM users WHERE email = 'lead@vellmoor.example'", []);
  const holder = await q<{ id: string }>("SELECT id FROM users WHERE email = $1", [holderEmail]);
  const ws = lead.workspace_id;
  const partType = await q<{ id: string }>(
    `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist, nominal_size_mm) VALUES ($1, $2, $3, 'camera', $4, $5, '[]', '{"width":40,"height":30}') RETURNING id`,
    [ws, `e2e-bench-${t}`, `E2E bench module ${t}`, JSON.stringify(BENCH_VIEWS), JSON.stringify(BENCH_DEFECTS)],
  );
  await db().query(`INSERT INTO rubric_versions (workspace_id, part_type_id, version, status, rubric, created_by, published_by, published_at) VALUES ($1, $2, 1, 'published', $3, $4, $4, now())`, [
    ws,
    partType.id,
    JSON.stringify(RUBRIC),
    lead.id,
  ]);
  const supplier = await q<{ id: string }>("INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, $2, 'bench@supplier.example') RETURNING id", [ws, `E2E bench supplier ${t}`]);
  const plan = fixturePlan(2);
  const lot = await q<{ id: string; created_at: Date }>(
    `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
     VALUES ($1, $2, $3, $4, 2, '2026-11-30', '2099-12-31', 'II', 1, 2.5, 'normal', $5, $6) RETURNING id, created_at`,
    [ws, supplier.id, partType.id, `PO-E2E-BENCH-${t}`, JSON.stringify(plan), lead.id],
  );
  const serial = `BEN-${t.toUpperCase()}`;
  const unit = await q<{ id: string }>(
    `INSERT INTO units (workspace_id, lot_id, sample_index, serial, status, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at, lease_holder_id, lease_expires_at, claimed_at)
     VALUES ($1, $2, 1, $3, 'on_bench', $4, $5, '2099-12-31', '2026-11-30', $6, $7, now() + interval '20 minutes', now()) RETURNING id`,
    [ws, lot.id, serial, partType.id, supplier.id, lot.created_at, holder.id],
  );
  // A second sampled unit of the same lot, still waiting in the queue (for Take next in this lot).
  const sibling = queuedSibling
    ? await q<{ id: string }>(
        `INSERT INTO units (workspace_id, lot_id, sample_index, serial, status, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at)
         VALUES ($1, $2, 2, $3, 'queued', $4, $5, '2099-12-31', '2026-11-30', $6) RETURNING id`,
        [ws, lot.id, `${serial}-2`, partType.id, supplier.id, lot.created_at],
      )
    : null;
  return { unitId: unit.id, serial, partTypeId: partType.id, siblingId: sibling?.id ?? null };
}

/** A plain photo of a dark part on a light card: `width` × `height`, the part in the middle half; never the same bytes twice. */
export async function partPhoto(width: number, height: number): Promise<Buffer> {
  const shade = 30 + crypto.randomInt(40);
  // A small tag of random colour in the card's corner, so two photos of one unit are never one file.
  const tag = await sharp({ create: { width: 16, height: 16, channels: 3, background: { r: crypto.randomInt(256), g: crypto.randomInt(256), b: crypto.randomInt(256) } } })
    .png()
    .toBuffer();
  const part = await sharp({ create: { width: width / 2, height: height / 2, channels: 3, background: { r: shade, g: shade + 4, b: shade + 8 } } })
    .png()
    .toBuffer();
  return sharp({ create: { width, height, channels: 3, background: { r: 224, g: 221, b: 214 } } })
    .composite([
      { input: part, left: width / 4, top: height / 4 },
      { input: tag, left: 8, top: 8 },
    ])
    .jpeg({ quality: 88 })
    .toBuffer();
}

/** Uploads a photo as the browser does, with the signed-in context's cookies; answers the ready photo. */
export async function uploadThroughApi(request: APIRequestContext, unitId: string, bytes: Buffer, viewKey: string, fileName = `${viewKey}.jpg`) {
  const intent = await request.post(`/api/units/${unitId}/photos/uploads`, { data: { viewKey, fileName, contentType: "image/jpeg", bytes: bytes.length } });
  if (intent.status() !== 201) throw new Error(`upload intent: ${intent.status()} ${await intent.text()}`);
  const { ticket, upload } = (await intent.json()) as { ticket: string; upload: { url: string; headers: Record<string, string> } };
  const put = await request.put(upload.url, { headers: upload.headers, data: bytes });
  if (put.status() !== 200) throw new Error(`PUT to the store: ${put.status()}`);
  const done = await request.post(`/api/units/${unitId}/photos`, { data: { ticket } });
  if (done.status() !== 201) throw new Error(`finalise: ${done.status()} ${await done.text()}`);
  return ((await done.json()) as { photo: { id: string; width: number; height: number; preview: { width: number; height: number } } }).photo;
}
