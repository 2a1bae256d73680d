/**
 * Rows a browser test of grading needs — a part type with a published rubric v1, a lot with one
 * unit on the bench, a processed photo and its regions — written straight into the test
 * server's PostgreSQL (the Bench and photo intake that would create them are other screens).
 * Plain SQL through `pg`: the app's db/client is server-only.
 */
import crypto from "node:crypto";
import pg from "pg";
import { fixturePlan } from "./db";

const hex = (n: number) => crypto.randomBytes(n).toString("hex");

// The part type's lens window is the left half of the Surface box; v1: scratch > 0.5 % → B, > 1 % → C.
const VIEWS = [
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
];
const DEFECTS = [
  { key: "scratch", label: "scratch", severity: "major" },
  { key: "dent", label: "dent", severity: "minor" },
];
const RUBRIC_V1 = {
  rules: [
    { id: "lens-scratch-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" },
    { id: "lens-scratch-c", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 1, grade: "C" },
  ],
};
const PLAN = fixturePlan(1, { lotSize: 10, switchingReason: "Browser test." });

export async function createGradableUnit(leadEmail: string) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    await client.query("BEGIN");
    const q = async <T extends pg.QueryResultRow>(text: string, values: unknown[]) => (await client.query<T>(text, values)).rows[0];
    const lead = await q<{ id: string; workspace_id: string }>("SELECT id, workspace_id FROM users WHERE email = $1", [leadEmail]);
    const ws = lead.workspace_id;
    const name = `Browser lens ${hex(3)}`;
    const partType = await q<{ id: string }>(
      `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist, nominal_size_mm) VALUES ($1, $2, $3, 'camera', $4, $5, '[]', '{"width":20,"height":10}') RETURNING id`,
      [ws, `browser-${hex(4)}`, name, JSON.stringify(VIEWS), JSON.stringify(DEFECTS)],
    );
    await client.query(`INSERT INTO rubric_versions (workspace_id, part_type_id, version, status, rubric, created_by, published_by, published_at) VALUES ($1, $2, 1, 'published', $3, $4, $4, now())`, [
      ws,
      partType.id,
      JSON.stringify(RUBRIC_V1),
      lead.id,
    ]);
    const supplier = await q<{ id: string }>(`INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, $2, 'browser@supplier.example') RETURNING id`, [ws, `Browser Supplier ${hex(4)}`]);
    const lot = await q<{ id: string; created_at: Date }>(
      `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
       VALUES ($1, $2, $3, $4, 10, '2026-12-01', '2026-12-08', 'II', 1, 4, 'normal', $5, $6) RETURNING id, created_at`,
      [ws, supplier.id, partType.id, `PO-${hex(3)}`, JSON.stringify(PLAN), lead.id],
    );
    const serial = `SN-${hex(4).toUpperCase()}`;
    const unit = await q<{ id: string }>(
      `INSERT INTO units (workspace_id, lot_id, sample_index, serial, status, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at)
       VALUES ($1, $2, 1, $3, 'on_bench', $4, $5, '2026-12-08', '2026-12-01', $6) RETURNING id`,
      [ws, lot.id, serial, partType.id, supplier.id, lot.created_at],
    );
    const photoId = crypto.randomUUID();
    await client.query(
      `INSERT INTO photos (id, workspace_id, unit_id, view_key, status, original_key, preview_key, thumbnail_key, content_type, file_name, bytes, sha256, format, width, height, uploaded_by)
       VALUES ($1, $2, $3, 'lens', 'ready', $4, $5, $6, 'image/jpeg', 'lens.jpg', 1000, $7, 'jpeg', 300, 200, $8)`,
      [photoId, ws, unit.id, `e2e/${photoId}/o`, `e2e/${photoId}/p`, `e2e/${photoId}/t`, hex(32), lead.id],
    );
    await client.query(`INSERT INTO region_sets (photo_id, workspace_id, version, updated_by) VALUES ($1, $2, 1, $3)`, [photoId, ws, lead.id]);
    // Surface 200 × 100 px; a 12 × 10 px scratch in the 100 × 100 px lens window = 1.2 % → C under v1.
    const regions = [
      [
        "surface-1",
        "surface",
        null,
        {
          kind: "polygon",
          points: [
            [50, 50],
            [250, 50],
            [250, 150],
            [50, 150],
          ],
        },
      ],
      ["scratch-1", "defect", "scratch", { kind: "rect", x: 60, y: 60, width: 12, height: 10 }],
    ] as const;
    for (const [clientId, role, defect, shape] of regions) {
      await client.query(`INSERT INTO regions (workspace_id, photo_id, client_id, role, defect_class, shape, author_id, version_written) VALUES ($1, $2, $3, $4, $5, $6, $7, 1)`, [
        ws,
        photoId,
        clientId,
        role,
        defect,
        JSON.stringify(shape),
        lead.id,
      ]);
    }
    await client.query("COMMIT");
    return { partTypeId: partType.id, partTypeName: name, unitId: unit.id, serial };
  } catch (err) {
    await client.query("ROLLBACK");
    throw err;
  } finally {
    await client.end();
  }
}
