/**
 * The Bench as a workspace (issue 15, items 3, 7, 9 and the Bench bits of 12), in Chromium at
 * 1440 × 900 and 1024 × 768: the canvas's top edge is in the first viewport and the page never
 * scrolls; the inspector marks a photo, switches photos by keyboard and the canvas never moves; a
 * thumbnail click then a key changes the tool; no grade preview is asked for before measuring;
 * a photo filed under the wrong view is reassigned and a wrong one removed with a reason; after
 * grading, the decision form folds away and Take next opens the lot's next unit. Screenshots at
 * the three sizes of the issue are kept in the test output.
 */
import { expect, test, type Page } from "@playwright/test";
import { createBenchUnit, partPhoto, uploadThroughApi } from "./bench-fixtures";
import { signInAs } from "./support";

async function stageBox(page: Page) {
  const stage = page.getByTestId("annotation-stage");
  await expect(stage).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  return (await stage.boundingBox())!;
}

/** Page position of an image point, from the stage's reported viewport. */
async function at(page: Page, x: number, y: number) {
  const stage = page.getByTestId("annotation-stage");
  const box = (await stage.boundingBox())!;
  const read = async (name: string) => Number(await stage.getAttribute(name));
  const zoom = await read("data-zoom");
  return { x: box.x + (await read("data-offset-x")) + x * zoom, y: box.y + (await read("data-offset-y")) + y * zoom };
}

async function drag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }) {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(to.x, to.y, { steps: 6 });
  await page.mouse.up();
}

const pageScroll = (page: Page) => page.evaluate(() => ({ y: window.scrollY, overflow: document.documentElement.scrollHeight - window.innerHeight }));

for (const [width, height] of [
  [1440, 900],
  [1024, 768],
] as const) {
  test(`at ${width} × ${height} the canvas is in the first viewport; marking, switching photos by keyboard and a thumbnail click then a key never move it`, async ({ page }, testInfo) => {
    test.setTimeout(120_000);
    const fixture = await createBenchUnit();
    await signInAs(page, "inspector@vellmoor.example");
    const front = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "front");
    const back = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "back");
    const previews: number[] = [];
    page.on("response", (res) => res.url().includes("/grade-preview") && previews.push(res.status()));

    await page.setViewportSize({ width, height });
    await page.goto(`/units/${fixture.unitId}?photo=${front.id}`);
    const first = await stageBox(page);
    expect(first.y, "the canvas's top edge is on the first screen").toBeLessThan(height * 0.3);
    expect(first.y + first.height, "the canvas's bottom edge is on the first screen too").toBeLessThanOrEqual(height);
    expect(first.height, "the canvas takes most of the height").toBeGreaterThan(height * 0.5);
    expect(await pageScroll(page)).toEqual({ y: 0, overflow: 0 });

    // Mark the front photo: B for Box, then a drag.
    await page.getByTestId("annotation-stage").focus();
    await page.keyboard.press("b");
    await drag(page, await at(page, 500, 400), await at(page, 800, 600));
    await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "1");
    await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });

    // PageDown opens the back photo; the Box is still in hand and the canvas has not moved.
    await page.keyboard.press("PageDown");
    await expect(page.getByTestId("photo-annotator")).toHaveAttribute("data-photo-id", back.id);
    expect(await stageBox(page)).toEqual(first);
    await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-tool", "box");
    await drag(page, await at(page, 300, 300), await at(page, 500, 450));
    await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "1");

    // A thumbnail click, then a key at once: the key reaches the photo just opened.
    await page.locator(`[data-testid=photo-card][data-photo-id="${front.id}"]`).getByTestId("photo-select").click();
    await page.keyboard.press("p");
    await expect(page.getByTestId("photo-annotator")).toHaveAttribute("data-photo-id", front.id);
    await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-tool", "spot");
    await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "1");
    expect(await stageBox(page)).toEqual(first);
    expect(await pageScroll(page)).toEqual({ y: 0, overflow: 0 });

    await page.screenshot({ path: testInfo.outputPath(`bench-${width}x${height}.png`) });
    // Nothing was measured, so the Bench never asked for a grade preview (it used to log a 409 each time).
    expect(previews).toEqual([]);
    await expect(page.getByTestId("what-if-waiting")).toContainText("Not measured yet");
  });
}

test("at 768 × 1024 (portrait) the canvas comes first and takes most of the height, the panels below it; folding them gives the photo the rest", async ({ page }, testInfo) => {
  const fixture = await createBenchUnit();
  await signInAs(page, "inspector@vellmoor.example");
  await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "front");
  await page.setViewportSize({ width: 768, height: 1024 });
  await page.goto(`/units/${fixture.unitId}`);
  const box = await stageBox(page);
  expect(box.y + box.height).toBeLessThanOrEqual(1024);
  expect(box.height, "the canvas takes most of the height").toBeGreaterThan(1024 * 0.5);
  const panels = (await page.getByTestId("side-panels").boundingBox())!;
  expect(panels.y).toBeGreaterThan(box.y + box.height);
  expect(await pageScroll(page)).toEqual({ y: 0, overflow: 0 });
  await page.screenshot({ path: testInfo.outputPath("bench-768x1024.png") });

  // Folded, the panels are one row of section buttons and the canvas grows into their place (same top edge).
  await page.getByTestId("fold-panels").click();
  await expect(page.getByTestId("side-panels")).toHaveAttribute("data-folded", "true");
  await expect.poll(async () => (await stageBox(page)).height).toBeGreaterThan(box.height + 150);
  expect((await stageBox(page)).y).toBe(box.y);
  // A section button brings the panels back with that section open.
  await page.getByTestId("jump-grade").click();
  await expect(page.getByTestId("side-panels")).toHaveAttribute("data-folded", "false");
  await expect(page.locator("#panel-grade")).toBeInViewport(); // scrolled to the top of the short panel area
  await expect.poll(async () => (await stageBox(page)).height).toBe(box.height);
  expect(await pageScroll(page)).toEqual({ y: 0, overflow: 0 });
});

test("a photo filed under the wrong view is reassigned, a wrong one is removed with its reason, and after grading Take next opens the lot's next unit", async ({ page }) => {
  test.setTimeout(150_000);
  const fixture = await createBenchUnit("inspector@vellmoor.example", { queuedSibling: true });
  await signInAs(page, "inspector@vellmoor.example");
  const front = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "front", "really-the-back.jpg");
  const stray = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "front", "another-unit.jpg");
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(`/units/${fixture.unitId}?photo=${front.id}`);
  await stageBox(page);
  await expect(page.getByTestId("missing-view")).toContainText("Back");

  // The Photos panel: file the first photo under Back; remove the stray one with a reason.
  await page.getByTestId("manage-photos").click();
  const rows = page.getByTestId("photo-row");
  await rows.filter({ hasText: "really-the-back.jpg" }).getByTestId("photo-view-select").selectOption("back");
  await expect(page.getByTestId("missing-view")).toHaveCount(0); // front (the stray) and back both have a photo now
  await expect(page.locator(`[data-testid=photo-card][data-photo-id="${front.id}"]`)).toContainText("Back");
  const strayRow = rows.filter({ hasText: "another-unit.jpg" });
  await strayRow.getByTestId("photo-remove").click();
  await strayRow.getByLabel("Why is this photo wrong?").fill("Another unit's module");
  await strayRow.getByRole("button", { name: "Remove photo" }).click();
  await expect(page.getByTestId("panel-photos")).toContainText("The photo was removed; nothing referred to it yet.");
  await expect(page.locator(`[data-testid=photo-card][data-photo-id="${stray.id}"]`)).toHaveCount(0);
  await expect(page.getByTestId("missing-view")).toContainText("Front");
  const units = (await (await page.request.get(`/api/units/${fixture.unitId}/photos`)).json()) as { photos: { id: string; viewKey: string }[] };
  expect(units.photos.map((p) => [p.id, p.viewKey])).toEqual([[front.id, "back"]]);

  // Mark, measure and grade; the decision form folds away and Take next takes the lot's next unit.
  await page.getByTestId("annotation-stage").focus();
  await page.keyboard.press("p");
  const spot = await at(page, 800, 600);
  await page.mouse.click(spot.x, spot.y);
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
  const panel = page.getByTestId("grade-panel");
  await panel.getByRole("button", { name: "Measure now" }).click();
  await expect(page.getByTestId("proposed-grade")).toBeVisible({ timeout: 30_000 });
  const proposed = (await page.getByTestId("proposed-grade").textContent())!.trim();
  await panel.getByRole("button", { name: "Record grade" }).click();
  await expect(panel).toContainText(`Grade ${proposed} recorded.`);
  await expect(panel.getByRole("form", { name: "Record the grade" })).toHaveCount(0);
  await expect(page.getByTestId("read-only-banner")).toContainText("graded");
  await expect(page.getByTestId("read-only-banner")).toHaveCount(1);
  await expect(panel.getByRole("button", { name: "Measure again" })).toBeDisabled();
  await page.getByRole("button", { name: "Take next in this lot" }).click();
  await page.waitForURL(new RegExp(`/units/${fixture.siblingId}`));
  await expect(page.getByTestId("unit-status")).toContainText("on your bench");
});
