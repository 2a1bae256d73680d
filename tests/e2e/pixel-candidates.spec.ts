/**
 * Pixel-fault suggestions on the Bench, in Chromium against the production build: only inside the
 * active screen area (the Surface and the view's zone, an edge band in), and accepting all of
 * them says how many were accepted and why any were not. Fixture geometry: screen-fixtures.ts.
 */
import { expect, test } from "@playwright/test";
import { uploadThroughApi } from "./bench-fixtures";
import { createScreenBenchUnit, SCREEN_INSIDE, SCREEN_SURFACE, screenPhoto } from "./screen-fixtures";
import { signInAs } from "./support";

test.describe.configure({ timeout: 180_000 });

type Spot = { kind: "spot"; x: number; y: number; radius: number };

test("pixel faults are suggested inside the active screen area only; accepting all says what was accepted and why not", async ({ page }) => {
  const { unitId } = await createScreenBenchUnit();
  await signInAs(page, "inspector@vellmoor.example");
  const photo = await uploadThroughApi(page.request, unitId, await screenPhoto(), "screen-white");
  const surface = await page.request.put(`/api/photos/${photo.id}/regions`, {
    data: { baseVersion: 0, regions: { surfaces: [{ id: "surface-1", shape: { kind: "polygon", points: SCREEN_SURFACE } }], regions: [], ruler: null } },
  });
  expect(surface.ok(), await surface.text()).toBe(true);

  await page.goto(`/units/${unitId}`);
  const bar = page.getByTestId("suggestions-bar");
  await bar.getByRole("button", { name: "Find pixel faults" }).click();
  await expect(page.getByTestId("suggestion-note")).toContainText("2 candidates found inside the Surface and the zone Screen active, 19 px in from their edges.");
  await expect(page.getByTestId("suggestion-item")).toHaveCount(2);
  await bar.getByTestId("accept-all-suggestions").click();
  await expect(page.getByTestId("suggestions-accepted")).toHaveText("Accepted 2 of 2.");

  // Asking again finds the same two; accepting them again adds nothing, and says why.
  await bar.getByRole("button", { name: "Find pixel faults" }).click();
  await expect(page.getByTestId("suggestion-item")).toHaveCount(2);
  await bar.getByTestId("accept-all-suggestions").click();
  await expect(page.getByTestId("suggestions-accepted")).toHaveText("Accepted 0 of 2: 2 repeat regions of the same class already marked there.");

  // Saved automatically: the Surface and the two Spots, where the faults are (centre of a 2 × 2 speck at x + 1, y + 1).
  await expect
    .poll(async () => ((await (await page.request.get(`/api/photos/${photo.id}/regions`)).json()) as { regions: { regions: unknown[] } }).regions.regions.length, { timeout: 15_000 })
    .toBe(2);
  const saved = (await (await page.request.get(`/api/photos/${photo.id}/regions`)).json()) as { regions: { regions: { defect: string; shape: Spot }[] } };
  for (const fault of SCREEN_INSIDE) {
    expect(
      saved.regions.regions.some((r) => r.defect === fault.kind && Math.hypot(r.shape.x - (fault.x + 1), r.shape.y - (fault.y + 1)) <= 1.5),
      `${fault.kind} at ${fault.x},${fault.y}`,
    ).toBe(true);
  }
});
