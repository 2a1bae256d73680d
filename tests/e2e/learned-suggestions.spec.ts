/**
 * Learned suggestions on the Bench, in Chromium against the production build and the demo data:
 * the demo workspace's model is the one the seed trained (db/seed/suggestion-model.ts). An
 * inspector opens a photo of a unit on their bench (a synthetic part photo with two planted
 * scratches and a stain, never one the model was trained or judged on), asks for suggestions,
 * sees learned ghosts with class and score, accepts one and dismisses another; both decisions are
 * recorded with who made them, and the accepted one is saved as an ordinary region.
 */
import { expect, test } from "@playwright/test";
import { renderDefectPhoto } from "@/db/seed/defect-photos";
import { createBenchUnit, uploadThroughApi } from "./bench-fixtures";
import { testDb } from "./db";
import { signInAs } from "./support";

test.describe.configure({ timeout: 180_000 });

/** plantedOn(904): scratch, stain and a second scratch (the bench part type has scratch, not stain). */
const PHOTO_INDEX = 904;

type DecisionRow = { decision: string; defect_class: string; email: string };

test("an inspector sees learned ghosts, accepts one and dismisses one; both are recorded", async ({ page }) => {
  const { unitId } = await createBenchUnit();
  await signInAs(page, "inspector@vellmoor.example");
  const photo = await uploadThroughApi(page.request, unitId, (await renderDefectPhoto(PHOTO_INDEX, 1280)).jpeg, "front");

  await page.goto(`/units/${unitId}`);
  const bar = page.getByTestId("suggestions-bar");
  await bar.getByTestId("suggest-learned").click();
  await expect(page.getByTestId("suggestion-note")).toContainText(/learned suggestions? inside the part's outline as Partproof found it .* from model \d+/);
  const learned = bar.locator('[data-testid="suggestion-item"][data-learned]');
  await expect.poll(() => learned.count()).toBeGreaterThanOrEqual(2);
  // Each says its class and score, and that it was learned.
  for (const text of await learned.allInnerTexts()) expect(text).toMatch(/^Scratch \d{1,3} % \(learned\)/);

  const count = await learned.count();
  await learned
    .first()
    .getByRole("button", { name: /^Accept / })
    .click();
  await expect(learned).toHaveCount(count - 1);
  await learned
    .first()
    .getByRole("button", { name: /^Dismiss / })
    .click();
  await expect(learned).toHaveCount(count - 2);

  // Recorded: one accepted, one dismissed, by the inspector, against the model that made them.
  const db = testDb();
  const decisions = async () =>
    (await db.query<DecisionRow>(`SELECT d.decision, d.defect_class, u.email FROM suggestion_decisions d JOIN users u ON u.id = d.decided_by WHERE d.photo_id = $1 ORDER BY d.decision`, [photo.id]))
      .rows;
  await expect.poll(decisions, { timeout: 15_000 }).toEqual([
    { decision: "accepted", defect_class: "scratch", email: "inspector@vellmoor.example" },
    { decision: "dismissed", defect_class: "scratch", email: "inspector@vellmoor.example" },
  ]);
  // The accepted ghost became an ordinary region, saved by the Bench's autosave.
  await expect
    .poll(async () => ((await (await page.request.get(`/api/photos/${photo.id}/regions`)).json()) as { regions: { regions: { defect: string }[] } }).regions.regions.map((r) => r.defect), {
      timeout: 15_000,
    })
    .toEqual(["scratch"]);
});
