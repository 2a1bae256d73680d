/**
 * The Gallery's trainer path in Chromium (issue 18's done-when, the Gallery part): a trainer
 * promotes a graded unit's photo from its Bench, edits the caption and the regions on the same
 * canvas, publishes; the inspector's Bench then shows the example in the reference panel when its
 * class is in hand, and opening it lays it beside the photo without moving the canvas.
 */
import { expect, test, type Page } from "@playwright/test";
import { createBenchUnit, partPhoto, uploadThroughApi } from "./bench-fixtures";
import { signInAs } from "./support";

test.describe.configure({ mode: "serial" });

async function signOut(page: Page) {
  await page.goto("/");
  await page.getByRole("button", { name: "Sign out" }).first().click();
  await expect(page).toHaveURL(/\/sign-in/);
}

async function stageBox(page: Page) {
  const stage = page.getByTestId("annotation-stage");
  await expect(stage).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  return (await stage.boundingBox())!;
}

test("a trainer promotes a graded unit's photo, edits caption and regions, publishes; the inspector finds it in the Bench's reference panel", async ({ page }) => {
  test.setTimeout(240_000);
  await page.setViewportSize({ width: 1440, height: 900 });
  const fixture = await createBenchUnit("inspector@vellmoor.example", { queuedSibling: true });

  // The inspector's graded unit: a photo with a Surface and a scratch, measured and accepted (the API the Bench uses).
  await signInAs(page, "inspector@vellmoor.example");
  const photo = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "front");
  const surface = {
    id: "surface-1",
    shape: {
      kind: "polygon",
      points: [
        [400, 300],
        [1200, 300],
        [1200, 900],
        [400, 900],
      ],
    },
  };
  const saved = await page.request.put(`/api/photos/${photo.id}/regions`, {
    data: {
      baseVersion: 0,
      regions: {
        regions: [
          {
            id: "scratch-1",
            defect: "scratch",
            shape: {
              kind: "line",
              points: [
                [500, 400],
                [900, 600],
              ],
              width: 8,
            },
          },
        ],
        surfaces: [surface],
        ruler: null,
      },
    },
  });
  expect(saved.status(), await saved.text()).toBe(200);
  expect((await page.request.post(`/api/units/${fixture.unitId}/measure`)).status()).toBe(200);
  expect((await page.request.post(`/api/units/${fixture.unitId}/grades`, { data: { decision: "accept" } })).status()).toBe(201);
  await uploadThroughApi(page.request, fixture.siblingId!, await partPhoto(1600, 1200), "front");
  await signOut(page);

  // The trainer finds the graded unit from the Gallery and opens its Bench (view only).
  await signInAs(page, "trainer@vellmoor.example");
  await page.goto("/gallery/new");
  await page
    .getByTestId("graded-units")
    .getByRole("link", { name: new RegExp(fixture.serial) })
    .click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(fixture.serial);
  await expect(page.getByTestId("read-only-banner")).toBeVisible();
  await page.getByTestId("add-to-gallery").click();
  await page.getByTestId("gallery-draft-link").click();

  // The draft: the unit's scratch and grade, to be captioned; a dent is marked on the same canvas.
  const item = page.getByTestId("gallery-item");
  await expect(item).toHaveAttribute("data-status", "draft");
  const itemUrl = page.url();
  await page.getByTestId("edit-item").click();
  await expect(page.getByTestId("gallery-canvas")).toHaveAttribute("data-read-only", "false");
  const box = await stageBox(page);
  const stage = page.getByTestId("annotation-stage");
  const [scale, ox, oy] = await Promise.all(["data-zoom", "data-offset-x", "data-offset-y"].map(async (n) => Number(await stage.getAttribute(n))));
  const at = (x: number, y: number) => ({ x: box.x + ox + x * scale, y: box.y + oy + y * scale });
  await page.getByTestId("tool-box").click();
  await page.getByTestId("defect-class-dent").click();
  const [from, to] = [at(1000, 700), at(1100, 780)];
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(to.x, to.y, { steps: 6 });
  await page.mouse.up();
  await expect(stage).toHaveAttribute("data-region-count", "3");
  await page.getByTestId("caption-input").fill("A scratch across the front and a small dent beside it: B under the published rubric.");
  await page.getByTestId("save-item").click();
  await expect(page.getByTestId("item-caption")).toHaveText("A scratch across the front and a small dent beside it: B under the published rubric.");
  await expect(page.getByTestId("gallery-canvas")).toHaveAttribute("data-read-only", "true");
  await expect(page.getByText("Dent, Scratch")).toBeVisible();
  await expect(page.getByTestId("rubric-says")).toContainText("The published rubric (v1) says");
  await page.getByTestId("publish-item").click();
  await expect(item).toHaveAttribute("data-status", "published");
  const itemId = itemUrl.split("/").pop()!;
  await signOut(page);

  // The inspector's next unit of the same part type: the example shows when Dent is in hand.
  await signInAs(page, "inspector@vellmoor.example");
  await page.goto(`/units/${fixture.siblingId}`);
  const before = await stageBox(page);
  await page.getByRole("button", { name: "Reference examples" }).click();
  const panel = page.getByTestId("reference-panel");
  await page.getByTestId("defect-class-crack").click();
  await expect(panel.getByText(/No published example of this view shows crack/)).toBeVisible();
  await page.getByTestId("defect-class-dent").click();
  const example = panel.locator(`[data-testid=reference-item][data-item-id="${itemId}"]`);
  await expect(example).toBeVisible();
  await example.click();
  await expect(page.getByTestId("reference-viewer")).toBeVisible();
  await expect(page.getByTestId("reference-caption")).toHaveText(/small dent beside it/);
  // Laid beside the photo, not pushing it: the canvas keeps its place and size.
  const after = (await page.getByTestId("annotation-stage").boundingBox())!;
  expect([after.x, after.y, after.width, after.height]).toEqual([before.x, before.y, before.width, before.height]);
  // Keyboard: Escape puts it away.
  await page.keyboard.press("Escape");
  await expect(page.getByTestId("reference-viewer")).toHaveCount(0);
});
