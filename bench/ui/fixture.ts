/**
 * The UI benchmark's fixture in the demo database (plain pg, as the e2e fixtures: the app's db
 * modules are server-only). Everything is named "(generated)" and reused on every run, so runs
 * add no rows after the first: a part type "UI bench module (generated)" with four defect
 * classes, a supplier, one open lot "UI-BENCH (generated)" due far ahead and one unit in it,
 * leased to the demo inspector for 20 minutes (the Bench renews the lease while it is open; the
 * bench gives it back to the queue at the end, where it is due last).
 * A unit that was graded in the meantime is left as it is and a new one is added to the lot.
 */
import type pg from "pg";
import { benchLotPlan } from "../../scripts/lib/bench-plan";
import { PHOTO, UI_BENCH_DEFECTS } from "./scene";

export const BENCH_INSPECTOR = "inspector@vellmoor.example";
const LEAD = "lead@vellmoor.example";
const PART_SLUG = "ui-bench-module";
const LOT_REF = "UI-BENCH (generated)";
const VIEWS = [{ key: "front", label: "Front", required: true, zones: [] }];

export type UiBenchFixture = { unitId: string; serial: string; photo: { id: string; bytes: number } | null; created: string[] };

export async function prepareFixture(pool: pg.Pool): Promise<UiBenchFixture> {
  const c = await pool.connect();
  const created: string[] = [];
  try {
    await c.query("BEGIN");
    const people = await c.query<{ id: string; email: string; workspace_id: string }>("SELECT id, email, workspace_id FROM users WHERE email = ANY($1) AND active", [[LEAD, BENCH_INSPECTOR]]);
    const lead = people.rows.find((r) => r.email === LEAD);
    const inspector = people.rows.find((r) => r.email === BENCH_INSPECTOR);
    if (!lead || !inspector || lead.workspace_id !== inspector.workspace_id) {
      throw new Error(`The demo accounts ${LEAD} and ${BENCH_INSPECTOR} are not in this database. Start the demo with \`npm start\` (it seeds an empty database).`);
    }
    const ws = lead.workspace_id;
    const one = async <T extends pg.QueryResultRow>(text: string, values: unknown[]) => (await c.query<T>(text, values)).rows[0] as T | undefined;

    let partType = await one<{ id: string }>("SELECT id FROM part_types WHERE workspace_id = $1 AND slug = $2", [ws, PART_SLUG]);
    if (partType) {
      // Ours alone: keep its classes and view as the scene expects them.
      await c.query("UPDATE part_types SET views = $2, defect_classes = $3 WHERE id = $1", [partType.id, JSON.stringify(VIEWS), JSON.stringify(UI_BENCH_DEFECTS)]);
    } else {
      partType = await one<{ id: string }>(
        `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist, nominal_size_mm)
         VALUES ($1, $2, 'UI bench module (generated)', 'camera', $3, $4, '[]', '{"width":40,"height":30}') RETURNING id`,
        [ws, PART_SLUG, JSON.stringify(VIEWS), JSON.stringify(UI_BENCH_DEFECTS)],
      );
      created.push("part type");
    }
    let supplier = await one<{ id: string }>("SELECT id FROM suppliers WHERE workspace_id = $1 AND name = 'UI bench supplier (generated)'", [ws]);
    if (!supplier) {
      supplier = await one<{ id: string }>("INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, 'UI bench supplier (generated)', 'ui-bench@supplier.example') RETURNING id", [ws]);
      created.push("supplier");
    }
    let lot = await one<{ id: string; created_at: Date }>(
      "SELECT id, created_at FROM lots WHERE workspace_id = $1 AND purchase_ref = $2 AND part_type_id = $3 AND status = 'open' ORDER BY created_at LIMIT 1",
      [ws, LOT_REF, partType!.id],
    );
    if (!lot) {
      const plan = benchLotPlan(1, "UI benchmark fixture");
      lot = await one<{ id: string; created_at: Date }>(
        `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
         VALUES ($1, $2, $3, $4, 1, '2026-12-01', '2099-12-31', 'II', 1, 2.5, 'normal', $5, $6) RETURNING id, created_at`,
        [ws, supplier!.id, partType!.id, LOT_REF, JSON.stringify(plan), lead.id],
      );
      created.push("lot");
    }
    let unit = await one<{ id: string; serial: string }>("SELECT id, serial FROM units WHERE lot_id = $1 AND status IN ('queued', 'on_bench') ORDER BY sample_index LIMIT 1", [lot!.id]);
    if (!unit) {
      const next = (await one<{ n: number }>("SELECT coalesce(max(sample_index), 0) + 1 AS n FROM units WHERE lot_id = $1", [lot!.id]))!.n;
      const serial = `UI-BENCH-${String(next).padStart(4, "0")}`;
      unit = await one<{ id: string; serial: string }>(
        `INSERT INTO units (workspace_id, lot_id, sample_index, serial, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at)
         VALUES ($1, $2, $3, $4, $5, $6, '2099-12-31', '2026-12-01', $7) RETURNING id, serial`,
        [ws, lot!.id, next, serial, partType!.id, supplier!.id, lot!.created_at],
      );
      await c.query("UPDATE lots SET quantity = $2 WHERE id = $1", [lot!.id, next]);
      created.push("unit");
    }
    // On the demo inspector's bench, as Take next would leave it.
    await c.query(
      `UPDATE units SET status = 'on_bench', lease_holder_id = $2, lease_expires_at = now() + interval '20 minutes', claimed_at = coalesce(claimed_at, now()), updated_at = now() WHERE id = $1`,
      [unit!.id, inspector.id],
    );
    const photo = await one<{ id: string; bytes: number }>(
      "SELECT id, bytes FROM photos WHERE unit_id = $1 AND view_key = 'front' AND status = 'ready' AND width = $2 AND height = $3 ORDER BY created_at LIMIT 1",
      [unit!.id, PHOTO.width, PHOTO.height],
    );
    await c.query("COMMIT");
    return { unitId: unit!.id, serial: unit!.serial, photo: photo ?? null, created };
  } catch (err) {
    await c.query("ROLLBACK");
    throw err;
  } finally {
    c.release();
  }
}
