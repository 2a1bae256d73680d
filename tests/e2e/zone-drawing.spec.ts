/**
 * A lead draws a view's zones on a sample photo of the part type with the Bench's canvas, in
 * Chromium against the production build; every checklist reading field has a visible label.
 * Photo 4000 × 3000 with the part in its middle half; the Surface traced at x 1000–3000,
 * y 750–2250 (2000 × 1500 px). A Box from (1200, 900) to (1800, 1350) is 0.1–0.4 × 0.1–0.4 of
 * the Surface's box (hand computation), within the drag's screen-pixel tolerance.
 */
import { expect, test } from "@playwright/test";
import { createBenchUnit, partPhoto, uploadThroughApi } from "./bench-fixtures";
import { signInAs } from "./support";

test.describe.configure({ timeout: 180_000 });

test("a lead draws a new zone on a photo of the part type, and it is saved with the part type", async ({ page, browser }) => {
  const { unitId, partTypeId } = await createBenchUnit();
  // The inspector holding the unit photographs the front and traces the part's Surface.
  const context = await browser.newContext();
  const bench = await context.newPage();
  await signInAs(bench, "inspector@vellmoor.example");
  const photo = await uploadThroughApi(bench.request, unitId, await partPhoto(4000, 3000), "front");
  const surface = {
    id: "surface-1",
    shape: {
      kind: "polygon",
      points: [
        [1000, 750],
        [3000, 750],
        [3000, 2250],
        [1000, 2250],
      ],
    },
  };
  const saved = await bench.request.put(`/api/photos/${photo.id}/regions`, { data: { baseVersion: 0, regions: { surfaces: [surface], regions: [], ruler: null } } });
  expect(saved.ok(), await saved.text()).toBe(true);
  await context.close();

  await signInAs(page, "lead@vellmoor.example");
  await page.goto(`/part-types/${partTypeId}`);
  const form = page.getByTestId("part-type-form");
  await form.getByTestId("view-editor-0").getByRole("button", { name: "Draw zones on a photo" }).click();
  const drawer = page.getByTestId("zone-drawer");
  await drawer.getByLabel("Key", { exact: true }).fill("connector");
  await drawer.getByLabel("Label", { exact: true }).fill("Connector");
  await drawer.getByRole("button", { name: "Add zone" }).click();

  const stage = drawer.getByTestId("annotation-stage");
  await expect(stage).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  // The existing zone (Lens window, left half of the Surface box) is already on the photo.
  await expect(stage).toHaveAttribute("data-region-count", "2");
  // Zones are offered as zones, not as defect classes of some severity.
  const bar = drawer.getByTestId("class-bar");
  await expect(bar).toHaveAccessibleName("Zones");
  await expect(bar).toContainText("Connector");
  await expect(bar).not.toContainText(/minor|major|critical/i);
  await stage.focus(); // before measuring: focus may scroll the stage into view
  const read = async (name: string) => Number(await stage.getAttribute(name));
  const [scale, ox, oy] = [await read("data-zoom"), await read("data-offset-x"), await read("data-offset-y")];
  const box = (await stage.boundingBox())!;
  const at = (x: number, y: number) => ({ x: box.x + ox + x * scale, y: box.y + oy + y * scale });
  await page.keyboard.press("b"); // Box
  await page.keyboard.press("2"); // the second zone class: Connector
  const from = at(1200, 900);
  const to = at(1800, 1350);
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(to.x, to.y, { steps: 6 });
  await page.mouse.up();
  await expect(stage).toHaveAttribute("data-region-count", "3");

  await drawer.getByRole("button", { name: "Use these zones" }).click();
  await expect(drawer.getByText(/Zones of Front taken into the form/)).toBeVisible();
  await drawer.getByRole("button", { name: "Close" }).click();
  await expect(form.getByTestId("view-zones-0")).toHaveText("Lens window, Connector");
  await form.getByRole("button", { name: "Save part type" }).click();
  await expect(form.getByRole("status")).toContainText("saved");

  const { partType } = (await (await page.request.get(`/api/part-types/${partTypeId}`)).json()) as { partType: { views: { key: string; zones: { id: string; polygon: [number, number][] }[] }[] } };
  const connector = partType.views.find((v) => v.key === "front")!.zones.find((z) => z.id === "connector")!;
  const tolerance = 2 / scale / 2000 + 0.002; // two screen pixels in Surface-box units
  const xs = connector.polygon.map(([u]) => u);
  const ys = connector.polygon.map(([, v]) => v);
  for (const [got, want] of [
    [Math.min(...xs), 0.1],
    [Math.max(...xs), 0.4],
    [Math.min(...ys), 0.1],
    [Math.max(...ys), 0.4],
  ])
    expect(Math.abs(got - want)).toBeLessThanOrEqual(tolerance);
  // The lens window, not redrawn, is kept exactly.
  expect(partType.views.find((v) => v.key === "front")!.zones.find((z) => z.id === "lens-window")!.polygon).toEqual([
    [0, 0],
    [0.5, 0],
    [0.5, 1],
    [0, 1],
  ]);
});

test("a lead removes a drawn zone in the drawer; a view with no photo yet says what to do instead", async ({ page, browser }) => {
  const { unitId, partTypeId } = await createBenchUnit();
  const context = await browser.newContext();
  const bench = await context.newPage();
  await signInAs(bench, "inspector@vellmoor.example");
  const photo = await uploadThroughApi(bench.request, unitId, await partPhoto(1200, 900), "front");
  const surface = {
    id: "surface-1",
    shape: {
      kind: "polygon",
      points: [
        [300, 225],
        [900, 225],
        [900, 675],
        [300, 675],
      ],
    },
  };
  const saved = await bench.request.put(`/api/photos/${photo.id}/regions`, { data: { baseVersion: 0, regions: { surfaces: [surface], regions: [], ruler: null } } });
  expect(saved.ok(), await saved.text()).toBe(true);
  await context.close();

  await signInAs(page, "lead@vellmoor.example");
  await page.goto(`/part-types/${partTypeId}`);
  const form = page.getByTestId("part-type-form");
  await form.getByTestId("view-editor-1").getByRole("button", { name: "Draw zones on a photo" }).click();
  const drawer = page.getByTestId("zone-drawer");
  await expect(drawer.getByTestId("zone-drawer-no-photo")).toHaveText(/No photo of the Back view yet\. Photograph a unit of this part type on the Bench first/);
  await drawer.getByRole("button", { name: "Close" }).click();

  await form.getByTestId("view-editor-0").getByRole("button", { name: "Draw zones on a photo" }).click();
  const stage = drawer.getByTestId("annotation-stage");
  await expect(stage).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  await expect(stage).toHaveAttribute("data-region-count", "2"); // the Surface and the lens window
  await expect(drawer.getByTestId("zone-list")).toContainText("Lens window");
  await drawer.getByRole("button", { name: "Remove zone Lens window" }).click();
  await expect(drawer.getByTestId("zone-list")).not.toContainText("Lens window");
  await expect(drawer.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "1");
  await drawer.getByRole("button", { name: "Use these zones" }).click();
  await expect(drawer.getByText(/Zones of Front taken into the form/)).toBeVisible();
  await drawer.getByRole("button", { name: "Close" }).click();
  await expect(form.getByTestId("view-zones-0")).toHaveText("none");
  await form.getByRole("button", { name: "Save part type" }).click();
  await expect(form.getByRole("status")).toContainText("saved");
  const { partType } = (await (await page.request.get(`/api/part-types/${partTypeId}`)).json()) as { partType: { views: { key: string; zones: unknown[] }[] } };
  expect(partType.views.find((v) => v.key === "front")!.zones).toEqual([]);
});

test("on a photo with no Surface a lead has one suggested and the stored zones appear; Enter adds a zone, never saves the part type; Close asks once before dropping a drawing", async ({
  page,
  browser,
}) => {
  const { unitId, partTypeId } = await createBenchUnit();
  const context = await browser.newContext();
  const bench = await context.newPage();
  await signInAs(bench, "inspector@vellmoor.example");
  await uploadThroughApi(bench.request, unitId, await partPhoto(1600, 1200), "front"); // no Surface traced
  await context.close();

  await signInAs(page, "lead@vellmoor.example");
  await page.goto(`/part-types/${partTypeId}`);
  const partTypeWrites: string[] = [];
  page.on("request", (r) => {
    if (r.method() !== "GET" && r.url().includes(`/api/part-types/${partTypeId}`)) partTypeWrites.push(r.method());
  });
  const form = page.getByTestId("part-type-form");
  await form.getByTestId("view-editor-0").getByRole("button", { name: "Draw zones on a photo" }).click();
  const drawer = page.getByTestId("zone-drawer");
  const stage = drawer.getByTestId("annotation-stage");
  await expect(stage).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  await expect(stage).toHaveAttribute("data-region-count", "0"); // no Surface, so no box for the lens window yet
  await drawer.getByRole("button", { name: "Suggest a Surface" }).click();
  await expect(drawer.getByText(/Suggested Surface/)).toBeVisible({ timeout: 20_000 });
  await expect(stage).toHaveAttribute("data-region-count", "2"); // the Surface and the lens window in its box
  await expect(drawer.getByTestId("zone-drawer-no-surface")).toBeHidden();

  await drawer.getByLabel("Key", { exact: true }).fill("connector");
  await drawer.getByLabel("Key", { exact: true }).press("Enter");
  await expect(drawer.getByTestId("zone-list")).toContainText("connector");
  await expect(drawer.getByLabel("Key", { exact: true })).toHaveValue("");
  await drawer.getByLabel("Key", { exact: true }).fill("Bad Key");
  await drawer.getByLabel("Key", { exact: true }).press("Enter");
  await expect(drawer.getByTestId("zone-add-problem")).toHaveText(/lower-case letters, digits and single hyphens/);

  await drawer.getByRole("button", { name: "Close" }).click();
  await expect(drawer.getByText(/not in the form yet/)).toBeVisible();
  await drawer.getByRole("button", { name: "Close without using" }).click();
  await expect(drawer).toBeHidden();
  await expect(form.getByTestId("view-zones-0")).toHaveText("Lens window");
  await expect(form.getByTestId("view-editor-0").getByRole("button", { name: "Draw zones on a photo" })).toBeFocused();
  expect(partTypeWrites).toEqual([]);
});

test("every field of a checklist reading has a visible label", async ({ page }) => {
  await signInAs(page, "lead@vellmoor.example");
  await page.goto("/part-types/new");
  const form = page.getByTestId("part-type-form");
  await form.getByRole("button", { name: "Add checklist item" }).click();
  const item = form.getByTestId("item-editor-0");
  await item.getByLabel("Kind").selectOption("numeric");
  for (const label of ["Key", "What the Bench checks", "Fails as", "Unit", "Minimum", "Maximum", "Decimals", "Set aside below"]) {
    await expect(item.getByText(label, { exact: true })).toBeVisible();
    await expect(item.getByLabel(label, { exact: true })).toBeVisible();
  }
});
