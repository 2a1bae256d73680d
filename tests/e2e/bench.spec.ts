/**
 * The Bench in Chromium, as an inspector: one shape with each tool drawn with the mouse, a class
 * changed with a number key, undo and redo, a reload that brings everything back — checked
 * through the API in the original's pixel coordinates (4000 × 3000 photo, 2560 × 1920 preview) —
 * a second tab that meets the first one's save and loses nothing, and a grade submitted.
 */
import { expect, test, type Page } from "@playwright/test";
import { createBenchUnit, partPhoto, uploadThroughApi } from "./bench-fixtures";
import { signInAs } from "./support";

type Shape =
  | { kind: "rect"; x: number; y: number; width: number; height: number }
  | { kind: "polygon"; points: [number, number][] }
  | { kind: "line"; points: [number, number][]; width: number }
  | { kind: "spot"; x: number; y: number; radius: number };
type RegionSet = {
  version: number;
  regions: { regions: { id: string; defect: string; shape: Shape }[]; surfaces: { id: string; shape: Shape }[]; ruler: { a: [number, number]; b: [number, number]; lengthMm: number } | null };
};

const ORIGINAL = { width: 4000, height: 3000 };

/**
 * The stage's viewport as the canvas reports it, and conversions between image and page pixels.
 * The stage is scrolled fully into view first (mouse events outside the viewport reach nothing),
 * and every conversion reads the stage's current box, so a later scroll cannot skew a point.
 */
async function stageView(page: Page) {
  const stage = page.getByTestId("annotation-stage");
  await expect(stage).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  await stage.evaluate((el) => el.scrollIntoView({ block: "end" }));
  const startY = (await stage.boundingBox())!.y;
  const read = async (name: string) => Number(await stage.getAttribute(name));
  const [scale, ox, oy] = [await read("data-zoom"), await read("data-offset-x"), await read("data-offset-y")];
  return {
    scale,
    /** Page position of an image point. */
    at: async (x: number, y: number) => {
      await stage.evaluate((el) => el.scrollIntoView({ block: "nearest" }));
      const box = (await stage.boundingBox())!;
      // Nothing above the canvas may change height while drawing: the photo would jump under the pointer.
      expect(box.y, "the canvas moved on the page").toBeCloseTo(startY, 0);
      return { x: box.x + ox + x * scale, y: box.y + oy + y * scale };
    },
    /** One screen pixel in image pixels, plus rounding of the reported offsets. */
    tolerance: 1.5 / scale + 1,
  };
}

async function drag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }) {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(to.x, to.y, { steps: 6 });
  await page.mouse.up();
}

async function click(page: Page, p: { x: number; y: number }) {
  await page.mouse.click(p.x, p.y);
  // Apart in time, so the canvas never counts two vertex clicks as a double-click.
  await page.waitForTimeout(350);
}

async function savedVersion(page: Page): Promise<number> {
  const status = page.getByTestId("save-status");
  await expect(status).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
  const text = (await status.textContent()) ?? "";
  return Number(/version (\d+)/.exec(text)?.[1] ?? "0");
}

const near = (got: number, want: number, tolerance: number) => expect(Math.abs(got - want), `${got} vs ${want} (± ${tolerance.toFixed(1)})`).toBeLessThanOrEqual(tolerance);

test("an inspector marks one shape with each tool, changes a class, undoes and redoes, reloads and finds everything in original pixels; a second tab loses nothing; the unit is graded", async ({
  page,
  context,
}, testInfo) => {
  test.setTimeout(180_000);
  const fixture = await createBenchUnit();
  await signInAs(page, "inspector@vellmoor.example");
  const photo = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(ORIGINAL.width, ORIGINAL.height), "front", "front-12mp.jpg");
  expect([photo.width, photo.height, photo.preview.width, photo.preview.height]).toEqual([4000, 3000, 2560, 1920]);

  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(`/units/${fixture.unitId}`);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(fixture.serial);
  await expect(page.getByTestId("lease-status")).toContainText("Reserved for you");
  await expect(page.getByTestId("missing-view")).toContainText("Missing"); // the back view
  const v = await stageView(page);
  expect(v.scale).toBeLessThan(0.5); // the whole 4000 px photo fits: drawn from the preview, scaled

  // Box (class 1: the least severe class comes first, so Dent) in the upper left, on the lens window.
  await page.getByTestId("tool-box").click();
  await drag(page, await v.at(1100, 800), await v.at(1500, 1100));
  // Outline: three clicks, then the first vertex again closes it.
  await page.getByTestId("tool-outline").click();
  for (const [x, y] of [
    [2200, 900],
    [2700, 900],
    [2450, 1300],
  ])
    await click(page, await v.at(x, y));
  await click(page, await v.at(2200, 900));
  // Line: two clicks and a double-click on the last point.
  await page.getByTestId("tool-line").click();
  await click(page, await v.at(1200, 1800));
  await click(page, await v.at(1700, 2000));
  const end = await v.at(2300, 1850);
  await page.mouse.dblclick(end.x, end.y);
  // Spot, dragged out to a 150 px radius, far right (x > 2560: not a preview coordinate).
  await page.getByTestId("tool-spot").click();
  await drag(page, await v.at(3500, 1500), await v.at(3650, 1500));
  // Surface around the part.
  await page.getByTestId("tool-surface").click();
  for (const [x, y] of [
    [1000, 750],
    [3000, 750],
    [3000, 2250],
    [1000, 2250],
  ])
    await click(page, await v.at(x, y));
  await click(page, await v.at(1000, 750));
  // Ruler along the part's top edge, 40 mm.
  await page.getByTestId("tool-ruler").click();
  await drag(page, await v.at(1000, 700), await v.at(3000, 700));
  await page.getByLabel("Ruler length (mm)").fill("40");
  await page.getByRole("button", { name: "Set length" }).click();
  await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "6");

  // Select the box and give it class 2 (scratch, the major class) with the number key; undo, then redo.
  await page.getByTestId("tool-select").click();
  await click(page, await v.at(1300, 950));
  await page.keyboard.press("2");
  // Surfaces list first (they lie underneath), so the box is found by its kind.
  const boxRow = page.getByTestId("region-item").filter({ hasText: "Box" });
  await expect(boxRow).toContainText("Scratch");
  await page.getByTestId("undo").click();
  await expect(boxRow).toContainText("Dent");
  await page.keyboard.press("Control+Shift+Z");
  await expect(boxRow).toContainText("Scratch");
  // The shortcut sheet opens on ?.
  await page.keyboard.press("?");
  await expect(page.getByTestId("shortcut-sheet")).toContainText("Choose the defect class");
  await page.keyboard.press("Escape");
  const firstVersion = await savedVersion(page);
  expect(firstVersion).toBeGreaterThan(0);

  await page.screenshot({ path: testInfo.outputPath("bench-1440x900.png"), fullPage: true });
  for (const [width, height] of [
    [1024, 768],
    [768, 1024],
  ]) {
    await page.setViewportSize({ width, height });
    await page.waitForTimeout(400);
    await page.screenshot({ path: testInfo.outputPath(`bench-${width}x${height}.png`), fullPage: true });
  }
  await page.setViewportSize({ width: 1440, height: 900 });

  // Reload: everything is where it was, on screen and through the API, in original pixels.
  await page.reload();
  await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "6", { timeout: 30_000 });
  await expect(page.getByTestId("region-item").filter({ hasText: "Box" })).toContainText("Scratch");
  const res = await page.request.get(`/api/photos/${photo.id}/regions`);
  const set = (await res.json()) as RegionSet;
  expect(set.version).toBe(firstVersion);
  const t = v.tolerance;
  const [box, outline, line, spot] = set.regions.regions;
  expect(box).toMatchObject({ defect: "scratch", shape: { kind: "rect" } });
  if (box.shape.kind !== "rect") throw new Error("not a box");
  near(box.shape.x, 1100, t);
  near(box.shape.y, 800, t);
  near(box.shape.width, 400, 2 * t);
  near(box.shape.height, 300, 2 * t);
  expect(outline.shape.kind).toBe("polygon");
  expect(line.shape.kind).toBe("line");
  if (outline.shape.kind !== "polygon" || line.shape.kind !== "line" || spot.shape.kind !== "spot") throw new Error("unexpected kinds");
  const outlinePoints = outline.shape.points;
  [
    [2200, 900],
    [2700, 900],
    [2450, 1300],
  ].forEach(([x, y], i) => (near(outlinePoints[i][0], x, t), near(outlinePoints[i][1], y, t)));
  expect(line.shape.points.length).toBeGreaterThanOrEqual(3);
  near(line.shape.points[0][0], 1200, t);
  near(line.shape.points.at(-1)![0], 2300, t);
  near(spot.shape.x, 3500, t);
  near(spot.shape.radius, 150, 2 * t);
  expect(spot.defect).toBe("dent");
  const surface = set.regions.surfaces[0].shape;
  if (surface.kind !== "polygon") throw new Error("surface is not a polygon");
  near(Math.max(...surface.points.map((p) => p[0])), 3000, t);
  near(set.regions.ruler!.b[0] - set.regions.ruler!.a[0], 2000, 2 * t);
  expect(set.regions.ruler!.lengthMm).toBe(40);
  const all = [...set.regions.regions, ...set.regions.surfaces].flatMap((r) => ("points" in r.shape ? r.shape.points : "x" in r.shape ? [[r.shape.x, r.shape.y]] : []));
  expect(all.every(([x, y]) => x >= 0 && x <= ORIGINAL.width && y >= 0 && y <= ORIGINAL.height)).toBe(true);

  // A second tab on the same photo: its save meets the first tab's newer save and merges.
  const second = await context.newPage();
  await second.setViewportSize({ width: 1440, height: 900 });
  await second.goto(`/units/${fixture.unitId}?photo=${photo.id}`);
  const v2 = await stageView(second);
  await page.bringToFront();
  await page.getByTestId("tool-spot").click();
  await click(page, await v.at(3300, 2700));
  const afterFirst = await savedVersion(page);
  expect(afterFirst).toBe(firstVersion + 1);
  await second.bringToFront();
  await second.getByTestId("tool-box").click();
  await drag(second, await v2.at(300, 300), await v2.at(600, 500));
  const dialog = second.getByTestId("conflict-dialog");
  await expect(dialog).toBeVisible({ timeout: 15_000 });
  await expect(dialog).toContainText("These regions were changed elsewhere");
  await expect(dialog).toContainText("nothing has been lost");
  await second.getByTestId("conflict-merge").click();
  await expect(second.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "8");
  expect(await savedVersion(second)).toBe(afterFirst + 1);
  const merged = (await (await second.request.get(`/api/photos/${photo.id}/regions`)).json()) as RegionSet;
  expect(merged.regions.regions).toHaveLength(6); // 4 + the first tab's spot + the second tab's box
  expect(merged.regions.regions.some((r) => r.shape.kind === "spot" && Math.abs(r.shape.x - 3300) <= t)).toBe(true);
  expect(merged.regions.regions.some((r) => r.shape.kind === "rect" && Math.abs(r.shape.x - 300) <= t)).toBe(true);
  await second.close();

  // Measure and grade: the proposal with its numbers, accepted; the unit moves on and the canvas closes.
  await page.bringToFront();
  await page.reload();
  await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "8", { timeout: 30_000 });
  const panel = page.getByTestId("grade-panel");
  await panel.getByRole("button", { name: "Measure now" }).click();
  await expect(page.getByTestId("proposed-grade")).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId("calibration")).toContainText("Ruler, 50.00 px/mm"); // 2000 px over 40 mm = 50 px/mm (hand computation)
  await expect(page.getByTestId("measure-scratch")).toBeVisible();
  const proposed = (await page.getByTestId("proposed-grade").textContent())!.trim();
  await panel.getByLabel(`Accept ${proposed}`).check();
  await panel.getByRole("button", { name: "Record grade" }).click();
  await expect(panel).toContainText(`Grade ${proposed} recorded.`);
  await expect(page.getByTestId("unit-status")).toContainText("graded");
  await expect(page.getByTestId("tool-box")).toHaveCount(0);
  const unit = await (await page.request.get(`/api/units/${fixture.unitId}`)).json();
  expect(unit.unit.status).toBe("graded");
});

test("an edit made while the server is unreachable is shown as unsaved, retried, and saved when it answers again", async ({ page }) => {
  const fixture = await createBenchUnit();
  await signInAs(page, "inspector@vellmoor.example");
  const photo = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "front");
  await page.goto(`/units/${fixture.unitId}`);
  const v = await stageView(page);
  let offline = true;
  await page.route(`**/api/photos/${photo.id}/regions`, (route) => (offline && route.request().method() === "PUT" ? route.abort("internetdisconnected") : route.fallback()));
  await page.getByTestId("tool-spot").click();
  await click(page, await v.at(800, 600));
  const status = page.getByTestId("save-status");
  await expect(status).toHaveAttribute("data-state", "retrying", { timeout: 10_000 });
  await expect(status).toContainText("Unsaved (retrying in");
  await expect(page.getByTestId("save-problem")).toContainText("have not reached the server");
  await expect(page.getByTestId("photo-unsaved")).toBeVisible();
  // Leaving now asks first.
  const asked = new Promise<string>((resolve) => page.once("dialog", (d) => (resolve(d.type()), void d.dismiss())));
  await page.evaluate(() => window.location.reload()).catch(() => {});
  expect(await asked).toBe("beforeunload");
  // Wait for a long backoff (1, 2, 4, then 8 s), so that a save within the next few seconds can
  // only come from the button; a short one let the automatic retry win the race on a busy machine.
  await expect(status).toContainText(/retrying in (8|16|30) s/, { timeout: 20_000 });
  offline = false;
  await page.getByRole("button", { name: "Try again now" }).click();
  await expect(status).toHaveAttribute("data-state", "saved", { timeout: 5_000 });
  expect(await savedVersion(page)).toBe(1);
  const set = (await (await page.request.get(`/api/photos/${photo.id}/regions`)).json()) as RegionSet;
  expect(set.regions.regions).toHaveLength(1);
});

test("someone else's unit opens read-only with a clear banner", async ({ page }) => {
  const fixture = await createBenchUnit("inspector2@vellmoor.example");
  await signInAs(page, "inspector2@vellmoor.example");
  await uploadThroughApi(page.request, fixture.unitId, await partPhoto(800, 600), "front");
  await page.context().clearCookies();
  await signInAs(page, "inspector@vellmoor.example");
  await page.goto(`/units/${fixture.unitId}`);
  await expect(page.getByTestId("read-only-banner")).toContainText("has this unit on their bench");
  await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  await expect(page.getByTestId("tool-box")).toHaveCount(0);
  await expect(page.getByTestId("save-status")).toHaveCount(0);
});
