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

async function demoWorkspace() {
  const { rows } = await testDb().query("SELECT w.id, u.id AS lead FROM workspaces w JOIN users u ON u.workspace_id = w.id WHERE w.slug = 'vellmoor' AND u.email = 'lead@vellmoor.example'");
  return { workspaceId: rows[0].id as string, leadId: rows[0].lead as string };
}

/**
 * A whole stored plan (Ac 0 / Re 1 per class) for lots the browser tests insert, so the Lots list
 * and the lot page judge them like any other lot. Every fixture lot uses it: a plan without its
 * per-class entries breaks the Lots list for everyone while that lot is open.
 */
export function fixturePlan(sampleSize: number, { lotSize = sampleSize, switchingReason = "e2e fixture" }: { lotSize?: number; switchingReason?: string } = {}) {
  const cell = { aql: 1, codeLetter: "A", planLetter: "A", sampleSize, accept: 0, reject: 1 };
  return {
    standard: "ISO 2859-1 single sampling",
    lotSize,
    level: "II",
    severity: "normal",
    sampleSize,
    hundredPercent: sampleSize >= lotSize,
    byDefectSeverity: { critical: cell, major: cell, minor: cell },
    switchingReason,
  };
}

/** A lot of `count` queued units in the demo workspace, due before anything else. */
export async function createUrgentLot(count: number, ref = `PO-E2E-${Date.now()}`) {
  return createQueuedLot(count, ref, { receivedOn: "2000-01-01", dueOn: "2000-01-02" });
}

/**
 * A lot of `count` queued units in the demo workspace, received and due on the given days
 * (a late due date keeps its units behind everything Take next should offer other tests).
 */
export async function createQueuedLot(count: number, ref: string, { receivedOn, dueOn, supplierId }: { receivedOn: string; dueOn: string; supplierId?: string }) {
  const db = testDb();
  const { workspaceId, leadId } = await demoWorkspace();
  const { rows: pt } = await db.query("SELECT id FROM part_types WHERE workspace_id = $1 ORDER BY name LIMIT 1", [workspaceId]);
  const { rows: sup } = supplierId ? { rows: [{ id: supplierId }] } : await db.query("SELECT id FROM suppliers WHERE workspace_id = $1 ORDER BY name LIMIT 1", [workspaceId]);
  const { rows: lot } = await db.query(
    `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
     VALUES ($1, $2, $3, $4, $5, $6, $7, 'II', 1, 2.5, 'normal', $8, $9) RETURNING id, created_at`,
    [workspaceId, sup[0].id, pt[0].id, ref, count, receivedOn, dueOn, JSON.stringify(fixturePlan(count)), leadId],
  );
  const { rows: units } = await db.query(
    `INSERT INTO units (workspace_id, lot_id, sample_index, serial, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at)
     SELECT $1, $2, g, $3 || '-' || g, $4, $5, $6, $7, $8 FROM generate_series(1, $9) g RETURNING id`,
    [workspaceId, lot[0].id, ref, pt[0].id, sup[0].id, dueOn, receivedOn, lot[0].created_at, count],
  );
  return { lotId: lot[0].id as string, unitIds: units.map((u) => u.id as string) };
}

/** A supplier of the demo workspace of its own, for tests that filter by supplier. */
export async function createSupplier(name: string) {
  const { workspaceId } = await demoWorkspace();
  const { rows } = await testDb().query("INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, $2, 'desk@e2e-list.example') RETURNING id", [workspaceId, name]);
  return rows[0].id as string;
}

/** Takes a fixture lot out of the queue so later tests never meet its units. */
export async function closeLot(lotId: string) {
  await testDb().query("UPDATE lots SET status = 'decided' WHERE id = $1", [lotId]);
}
