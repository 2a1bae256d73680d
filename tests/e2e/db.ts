/** Plain pg access for browser tests (fixtures and time travel); the app's own modules stay out. */
import pg from "pg";

let pool: pg.Pool | null = null;

export function testDb(): pg.Pool {
  if (!pool) {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error("DATABASE_URL is not set; run browser tests through `npm test`.");
    pool = new pg.Pool({ connectionString: url, max: 2 });
  }
  return pool;
}

/** A lot of `count` queued units in the demo workspace, due before anything else. */
export async function createUrgentLot(count: number, ref = `PO-E2E-${Date.now()}`) {
  const db = testDb();
  const { rows: ws } = await db.query("SELECT w.id, u.id AS lead FROM workspaces w JOIN users u ON u.workspace_id = w.id WHERE w.slug = 'vellmoor' AND u.email = 'lead@vellmoor.example'");
  const { rows: pt } = await db.query("SELECT id FROM part_types WHERE workspace_id = $1 ORDER BY name LIMIT 1", [ws[0].id]);
  const { rows: sup } = await db.query("SELECT id FROM suppliers WHERE workspace_id = $1 ORDER BY name LIMIT 1", [ws[0].id]);
  const plan = { standard: "ISO 2859-1 single sampling", lotSize: count, level: "II", severity: "normal", sampleSize: count, hundredPercent: true, byDefectSeverity: {}, switchingReason: "e2e fixture" };
  const { rows: lot } = await db.query(
    `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
     VALUES ($1, $2, $3, $4, $5, '2000-01-01', '2000-01-02', 'II', 1, 2.5, 'normal', $6, $7) RETURNING id, created_at`,
    [ws[0].id, sup[0].id, pt[0].id, ref, count, JSON.stringify(plan), ws[0].lead],
  );
  const { rows: units } = await db.query(
    `INSERT INTO units (workspace_id, lot_id, sample_index, serial, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at)
     SELECT $1, $2, g, $3 || '-' || g, $4, $5, '2000-01-02', '2000-01-01', $6 FROM generate_series(1, $7) g RETURNING id`,
    [ws[0].id, lot[0].id, ref, pt[0].id, sup[0].id, lot[0].created_at, count],
  );
  return { lotId: lot[0].id as string, unitIds: units.map((u) => u.id as string) };
}

/** Takes a fixture lot out of the queue so later tests never meet its units. */
export async function closeLot(lotId: string) {
  await testDb().query("UPDATE lots SET status = 'decided' WHERE id = $1", [lotId]);
}
