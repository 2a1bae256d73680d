/**
 * Cosmetic grades in the lot verdict, in Chromium against the production build: the supplier's
 * promised grade reaches the Receive-a-lot form, and the lot page counts units defective only
 * cosmetically, only functionally and both, once per severity class (ISO 2859-1 practice for
 * classified nonconformities, b; docs/contracts.md "Lot verdict counting").
 * Units are inspected through the API as the Bench would (checklist, regions, measure, grade);
 * only the processed photo row is a fixture (measuring never reads the image).
 * Lot 10 at level II → code B, n 3; AQL 4.0 at B → Ac 0 Re 1 (Table 2-A, b; as lot-cosmetic.test.ts).
 */
import crypto from "node:crypto";
import { expect, test, type APIRequestContext } from "@playwright/test";
import { testDb } from "./db";
import { signInAs } from "./support";

test.describe.configure({ timeout: 180_000 });

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`;
const SURFACE = {
  id: "surface",
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
const SCRATCH = { id: "scratch", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 30, height: 10 } }; // 1.5 % of the Surface
const DENT = { id: "dent", defect: "dent", shape: { kind: "spot", x: 200, y: 120, radius: 4 } };

async function ok<T = unknown>(res: Awaited<ReturnType<APIRequestContext["post"]>>): Promise<T> {
  expect(res.ok(), await res.text()).toBe(true);
  return (await res.json()) as T;
}

/** A processed photo row of the unit, as photo intake leaves it. */
async function readyPhoto(unitId: string): Promise<string> {
  const id = crypto.randomUUID();
  await testDb().query(
    `INSERT INTO photos (id, workspace_id, unit_id, view_key, status, original_key, preview_key, thumbnail_key, content_type, file_name, bytes, sha256, format, width, height, uploaded_by)
     SELECT $1, u.workspace_id, u.id, 'back', 'ready', $2, $3, $4, 'image/jpeg', 'back.jpg', 1000, $5, 'jpeg', 300, 200, l.created_by FROM units u JOIN lots l ON l.id = u.lot_id WHERE u.id = $6`,
    [id, `e2e/${id}/o`, `e2e/${id}/p`, `e2e/${id}/t`, crypto.randomBytes(32).toString("hex"), unitId],
  );
  return id;
}

async function inspect(request: APIRequestContext, unitId: string, power: boolean, regions: object[]) {
  await ok(await request.patch(`/api/units/${unitId}`, { data: { serial: `E2E-COS-${unitId.slice(0, 8)}` } }));
  await ok(await request.post(`/api/units/${unitId}/checklist`, { data: { itemId: "power", value: { pass: power } } }));
  const photoId = await readyPhoto(unitId);
  const put = await request.put(`/api/photos/${photoId}/regions`, { data: { baseVersion: 0, regions: { surfaces: [SURFACE], regions, ruler: null } } });
  expect(put.ok(), await put.text()).toBe(true);
  const { measurement } = await ok<{ measurement: { id: string } }>(await request.post(`/api/units/${unitId}/measure`));
  await ok(await request.post(`/api/units/${unitId}/grades`, { data: { decision: "accept", measurementId: measurement.id } }));
}

test("units defective only cosmetically, only functionally and both count once per class on the lot page", async ({ page }) => {
  const supplier = `Refurb Pulls ${stamp()}`;
  await signInAs(page, "lead@vellmoor.example");

  // A supplier of refurbished pulls: its lots are bought at B.
  await page.goto("/suppliers");
  const form = page.getByTestId("supplier-form");
  await form.getByLabel("Name").fill(supplier);
  await form.getByLabel("Contact person").fill("Oona Pell");
  await form.getByLabel("Contact e-mail").fill("desk@e2e-refurb.example");
  await form.getByLabel("Grade lots are bought at").selectOption("B");
  await form.getByRole("button", { name: "Add supplier" }).click();
  await expect(form.getByRole("status")).toContainText(`${supplier} added.`);

  // A part type with one major checklist item and a published rubric, through the API.
  const partTypeName = `Cosmetic housing ${stamp()}`;
  const { partType } = await ok<{ partType: { id: string } }>(
    await page.request.post("/api/part-types", {
      data: {
        name: partTypeName,
        category: "housing",
        views: [{ key: "back", label: "Back", required: true, zones: [] }],
        defectClasses: [
          { key: "scratch", label: "Scratch", severity: "major" },
          { key: "dent", label: "Dent", severity: "minor" },
        ],
        checklist: [{ id: "power", label: "Powers on", kind: "pass_fail", severityOnFail: "major" }],
        nominalSizeMm: { width: 20, height: 10 },
      },
    }),
  );
  await ok(await page.request.post(`/api/part-types/${partType.id}/rubrics`));
  const { draft } = await ok<{ draft: { version: number; revision: number } }>(await page.request.get(`/api/part-types/${partType.id}/rubrics/draft`));
  const saved = await ok<{ version: number; revision: number }>(
    await page.request.patch(`/api/part-types/${partType.id}/rubrics/draft`, {
      data: {
        version: draft.version,
        revision: draft.revision,
        rubric: {
          rules: [
            { id: "scratch-c", metric: "share", defect: "scratch", comparison: ">", threshold: 1, grade: "C" },
            { id: "dent-b", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "B" },
            { id: "func-major", metric: "functionalFailures", severity: "major", comparison: ">", threshold: 0, grade: "C" },
          ],
        },
      },
    }),
  );
  await ok(await page.request.post(`/api/part-types/${partType.id}/rubrics/draft/publish`, { data: { version: saved.version, revision: saved.revision } }));

  // Receive the lot: the promised grade follows the supplier's default.
  const ref = `PO-COS-${stamp()}`;
  await page.goto("/lots/new");
  await page.getByLabel("Supplier").selectOption({ label: supplier });
  await page.getByLabel("Part type").selectOption({ label: partTypeName });
  await expect(page.getByLabel("Grade the purchase promised")).toHaveValue("B");
  await expect(page.getByTestId("promised-grade-source")).toContainText(`From ${supplier}'s default.`);
  await page.getByLabel("Purchase reference").fill(ref);
  await page.getByLabel("Quantity received").fill("10");
  await page.getByLabel("AQL major").selectOption("4");
  await page.getByLabel("AQL minor").selectOption("4");
  await page.getByRole("button", { name: "Receive lot" }).click();
  await expect(page.getByRole("heading", { level: 1, name: `Lot ${ref}` })).toBeVisible();
  await expect(page.getByTestId("promised-grade")).toHaveText("bought at grade B");
  await expect(page.getByTestId("inspected-rule")).toContainText("A unit is inspected once it is graded");
  const lotId = page.url().split("/").pop()!;

  await ok(await page.request.post(`/api/lots/${lotId}/units`, { data: { source: "placeholders" } }));
  const { units } = await ok<{ units: { id: string }[] }>(await page.request.get(`/api/lots/${lotId}/units`));
  await inspect(page.request, units[0].id, true, [SCRATCH]); // cosmetic only: C < B through the scratch
  await inspect(page.request, units[1].id, false, [DENT]); // functional only: C through the failure; the dent keeps B
  await inspect(page.request, units[2].id, false, [SCRATCH, DENT]); // both, both major

  await page.reload();
  await expect(page.getByTestId("unit-grade-1")).toHaveText("C");
  await expect(page.getByTestId("unit-cosmetic-1")).toContainText("Major");
  await expect(page.getByTestId("unit-cosmetic-1")).toContainText("grade C (promised B): Scratch");
  await expect(page.getByTestId("unit-cosmetic-2")).toHaveText("—");
  await expect(page.getByTestId("unit-row-2")).toContainText(/1\s*Major/); // the failed item
  await expect(page.getByTestId("unit-cosmetic-3")).toContainText("grade C (promised B): Scratch");
  // Three major defectives, each counted once; nothing minor (the dent never broke the promise).
  await expect(page.getByTestId("found-major")).toHaveText("3");
  await expect(page.getByTestId("found-minor")).toHaveText("0");
  await expect(page.getByTestId("lot-verdict")).toHaveText("Reject");
  await expect(page.getByTestId("counting-rule")).toContainText("a grade worse than the promised grade (B)");
});
