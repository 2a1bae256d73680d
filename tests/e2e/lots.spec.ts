/**
 * Lots end to end in Chromium against the production build.
 * Lot 120 at level II → code F (Table 1, REF a); major AQL 1.0 → E, n 13, Ac 0 / Re 1 (N1, N3);
 * minor 2.5 → n 20, Ac 1 / Re 2 (N1, N2); critical: any defect rejects (c). Tightened, lot 120:
 * major F n 20 0/1 (T1, T2). Switching: 2 of 5 lots not accepted → tightened (SW, b; sqconline, a).
 */
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { signInAs } from "./support";

// Two browsers and a dozen API round trips: more than the default 60 s when the machine is busy.
test.describe.configure({ timeout: 180_000 });

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`;

async function createSupplier(page: Page, name: string) {
  await page.goto("/suppliers");
  const form = page.getByTestId("supplier-form");
  await form.getByLabel("Name").fill(name);
  // (Leaving "Contact person" empty currently fails in the supplier form: it sends null. Reported.)
  await form.getByLabel("Contact person").fill("Rhea Tollan");
  await form.getByLabel("Contact e-mail").fill("desk@e2e-supplier.example");
  await form.getByRole("button", { name: "Add supplier" }).click();
  await expect(form.getByRole("status")).toContainText(`${name} added.`);
}

async function fillLotForm(page: Page, { supplier, partType, ref, quantity }: { supplier: string; partType: string; ref: string; quantity: number }) {
  await page.goto("/lots/new");
  await page.getByLabel("Supplier").selectOption({ label: supplier });
  await page.getByLabel("Part type").selectOption({ label: partType });
  await page.getByLabel("Purchase reference").fill(ref);
  await page.getByLabel("Quantity received").fill(String(quantity));
  await page.getByLabel("Received", { exact: true }).fill("2026-11-20");
  await page.getByLabel("Due", { exact: true }).fill("2026-11-27");
}

test("a lead receives a lot and imports serials; an inspector's out-of-limit battery voltage fails with the caution shown", async ({ page, browser }) => {
  const supplier = `Brackwater Cells ${stamp()}`;
  const ref = `PO-E2E-${stamp()}`;
  await signInAs(page, "lead@vellmoor.example");
  await createSupplier(page, supplier);
  await fillLotForm(page, { supplier, partType: "Battery", ref, quantity: 120 });
  await expect(page.getByTestId("switching-reason")).toContainText("starting state");
  await expect(page.getByTestId("plan-preview")).toContainText("inspect 20 of 120 units");
  await page.getByRole("button", { name: "Receive lot" }).click();

  await expect(page.getByRole("heading", { level: 1, name: `Lot ${ref}` })).toBeVisible();
  await expect(page.getByTestId("code-letter-major")).toHaveText("F");
  await expect(page.getByTestId("sample-size-major")).toHaveText("13");
  await expect(page.getByTestId("ac-re-major")).toHaveText("0 / 1");
  await expect(page.getByTestId("sample-size-minor")).toHaveText("20");
  await expect(page.getByTestId("ac-re-minor")).toHaveText("1 / 2");
  await expect(page.getByTestId("ac-re-critical")).toHaveText("0 / 1");
  await expect(page.getByTestId("lot-verdict")).toHaveText("Pending");

  // Paste the supplier's list with a bad line first: the problem is named, nothing is sent.
  const serials = Array.from({ length: 120 }, (_, i) => `BW-BAT-26-${String(i + 1).padStart(6, "0")}`);
  const box = page.getByLabel(/Serials \(CSV/);
  await box.fill(["serial", ...serials, "BW BAT bad"].join("\n"));
  await expect(page.getByTestId("serial-problems")).toContainText("line 122: “BW BAT bad” contains a space");
  await expect(page.getByRole("button", { name: "Draw 20 from the list" })).toBeDisabled();
  await box.fill(["serial", ...serials].join("\n"));
  await expect(page.getByTestId("serial-count")).toContainText("120 serials read (header on line 1)");
  await page.getByRole("button", { name: "Draw 20 from the list" }).click();
  await expect(page.getByTestId("lot-units").getByRole("row")).toHaveCount(21);
  await expect(page.getByTestId("sample-draw")).toContainText("list of 120 serials with seed");
  const lotUrl = page.url();

  // The inspector, in their own browser, takes the first sampled unit.
  const context = await browser.newContext();
  const bench = await context.newPage();
  await signInAs(bench, "inspector@vellmoor.example");
  await bench.goto(lotUrl);
  await bench.getByTestId("unit-row-1").getByRole("link").click();
  await expect(bench.getByTestId("checklist-panel")).toBeVisible();
  await expect(bench.getByTestId("checklist-panel").getByRole("note").first()).toContainText("Lithium battery caution");
  const ocv = bench.getByTestId("checklist-item-ocv");
  await ocv.getByLabel(/Open-circuit voltage reading/).fill("2,87");
  await expect(ocv).toContainText("Will fail: 2.87 V is below the minimum 3.00 V.");
  await ocv.getByRole("button", { name: "Save reading" }).click();
  await expect(bench.getByTestId("result-ocv")).toContainText("Failed automatically — 2.87 V is below the minimum 3.00 V. Adds a major functional defect.");
  // Who and when, with the date (a reading kept from an earlier day must not read as today's), in
  // the workspace's zone, which the page names once.
  await expect(bench.getByTestId("result-ocv")).toContainText(/, \d{4}-\d{2}-\d{2} \d{2}:\d{2}$/);
  // The Bench fills the window without the sidebar: the zone is named in its top bar.
  await expect(bench.getByTestId("time-zone-note").first()).toBeVisible();
  await expect(bench.getByTestId("time-zone-note").first()).toContainText("Times in UTC");
  // An ordinary out-of-limit reading is a failure; below 2.50 V the cell is set aside as suspect, a
  // stronger caution (protection cut-off about 2.5 V: a, Battery University BU-802c; handling: c).
  await expect(bench.getByTestId("suspect-reading")).toHaveCount(0);
  await ocv.getByLabel(/Open-circuit voltage reading/).fill("2.31");
  await expect(ocv).toContainText("Will fail: 2.31 V is below the minimum 3.00 V. Below 2.50 V: set it aside as suspect.");
  await ocv.getByRole("button", { name: "Save reading" }).click();
  await expect(bench.getByTestId("suspect-reading")).toContainText("Set this cell aside as suspect. Open-circuit voltage 2.31 V is below 2.50 V.");
  await expect(bench.getByTestId("suspect-reading")).toContainText("do not charge it normally");
  await expect(bench.getByTestId("unit-status")).toContainText("on your bench");
  // A swollen cell, failed by hand with a note: critical, and the hazard warning appears.
  const swelling = bench.getByTestId("checklist-item-swelling");
  await swelling.getByLabel("Note").fill("Bulge at the connector end, 1 mm");
  await swelling.getByRole("button", { name: "Fail" }).click();
  await expect(bench.getByTestId("battery-hazard")).toContainText("isolate it in a fire-safe container");
  await expect(bench.getByTestId("result-swelling")).toContainText("Failed (marked by the inspector). Adds a critical functional defect.");
  await expect(bench.getByTestId("result-swelling")).not.toContainText("automatically");
  await expect(bench.getByTestId("saved-note-swelling")).toHaveText("Note: Bulge at the connector end, 1 mm");
  await context.close();

  // Back on the lot page: the verdict follows Ac/Re (a major and a critical defective, Re 1 each).
  await page.goto(lotUrl);
  await expect(page.getByTestId("found-major")).toHaveText("1");
  await expect(page.getByTestId("found-critical")).toHaveText("1");
  await expect(page.getByTestId("lot-verdict")).toHaveText("Reject");
  const form = page.getByTestId("disposition-form");
  await form.getByLabel("Return to vendor").check();
  await form.getByLabel("Reason").fill("Deeply discharged and swollen cell in the sample.");
  await form.getByRole("button", { name: "Record disposition" }).click();
  await expect(page.getByTestId("disposition")).toContainText("Return to vendor");
});

/** A decided lot of 2 of a checklist-only flex part through the API (as the lead's browser session). */
async function decidedLot(request: APIRequestContext, supplierId: string, partTypeId: string, reject: boolean, ref: string) {
  const ok = async <T = unknown>(res: Awaited<ReturnType<APIRequestContext["post"]>>): Promise<T> => {
    expect(res.ok(), await res.text()).toBe(true);
    return (await res.json()) as T;
  };
  const { lot } = await ok<{ lot: { id: string } }>(
    await request.post("/api/lots", {
      data: { supplierId, partTypeId, purchaseRef: ref, quantity: 2, receivedOn: "2026-11-01", dueOn: "2026-11-05", inspectionLevel: "II", aqlCritical: null, aqlMajor: 1.0, aqlMinor: 2.5 },
    }),
  );
  await ok(await request.post(`/api/lots/${lot.id}/units`, { data: { source: "placeholders" } }));
  const { units } = await ok<{ units: { id: string }[] }>(await request.get(`/api/lots/${lot.id}/units`));
  for (const [i, unit] of units.entries()) {
    await ok(await request.patch(`/api/units/${unit.id}`, { data: { serial: `${ref}-${i}` } }));
    for (const itemId of ["power", "volume-up", "volume-down", "side-switch"]) {
      await ok(await request.post(`/api/units/${unit.id}/checklist`, { data: { itemId, value: { pass: !(reject && i === 0 && itemId === "power") } } }));
    }
  }
  await ok(await request.post(`/api/lots/${lot.id}/disposition`, { data: reject ? { disposition: "return_to_vendor", reason: "Dead power button." } : { disposition: "to_stock", reason: "Clean." } }));
}

test("after five lots with two rejections the next lot is on tightened inspection, and the pages say why", async ({ page }) => {
  const supplier = `Fenwick Flex ${stamp()}`;
  await signInAs(page, "lead@vellmoor.example");
  await createSupplier(page, supplier);
  const suppliers = (await (await page.request.get("/api/suppliers")).json()).suppliers as { id: string; name: string }[];
  const supplierId = suppliers.find((s) => s.name === supplier)!.id;
  // Like the seeded button flex, but without a published rubric: its units count on their
  // checklists alone, so a clean pair is accepted without photos and grades (lib/lots/findings.ts).
  const created = await page.request.post("/api/part-types", {
    data: {
      name: `Switching flex ${stamp()}`,
      category: "flex",
      views: [{ key: "front", label: "Front", required: true, zones: [] }],
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
      checklist: ["power", "volume-up", "volume-down", "side-switch"].map((id) => ({ id, label: `${id} responds`, kind: "pass_fail", severityOnFail: "major" })),
    },
  });
  expect(created.ok(), await created.text()).toBe(true);
  const flex = ((await created.json()) as { partType: { id: string; name: string } }).partType;
  const refs = [1, 2, 3, 4, 5].map((n) => `FW-${stamp()}-${n}`);
  for (const [i, ref] of refs.entries()) await decidedLot(page.request, supplierId, flex.id, i === 1 || i === 4, ref);

  await fillLotForm(page, { supplier, partType: flex.name, ref: `FW-NEXT-${stamp()}`, quantity: 120 });
  const why = `2 of the last 5 lots on normal inspection were not accepted (${refs[1]}, ${refs[4]}) → tightened.`;
  await expect(page.getByTestId("switching-box")).toContainText("Tightened");
  await expect(page.getByTestId("switching-reason")).toHaveText(why);
  await expect(page.getByTestId("plan-preview").getByTestId("ac-re-major")).toHaveText("0 / 1");
  await expect(page.getByTestId("plan-preview").getByTestId("sample-size-major")).toHaveText("20");
  await page.getByRole("button", { name: "Receive lot" }).click();
  await expect(page.getByTestId("plan-switching")).toContainText(`Tightened inspection, level II. Why: ${why}`);
  await expect(page.getByTestId("sample-size-major")).toHaveText("20");
});
