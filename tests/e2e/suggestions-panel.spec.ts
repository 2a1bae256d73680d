/**
 * The Gallery's "Suggestions" panel (issue 20, item 4), in Chromium against the production build:
 * - the demo trainer sees the model history — the seeded model, in use, with what it learned from
 *   and its held-out recall and precision per class, the figures the database holds for it;
 * - "Train now" queues a training in the job worker and the panel follows it to its outcome. That
 *   part runs in a workspace of its own (made here, with a trainer and nothing to learn from), so
 *   whatever the training decides never changes the demo workspace's model that
 *   learned-suggestions.spec.ts relies on, whichever file runs first.
 */
import { hash } from "@node-rs/argon2";
import { expect, test } from "@playwright/test";
import { testDb } from "./db";
import { signInAs } from "./support";

test.describe.configure({ timeout: 180_000 });

type ClassFigures = { accepted: number; suggested: number; hits: number; recall: number; precision: number };
type StoredModel = { version: number; in_use: boolean; evaluation: { byClass: Record<string, ClassFigures> }; suggestable: { defect: string; suggest: boolean }[] };

test("the demo trainer sees the model history with its held-out figures per class", async ({ page }) => {
  const { rows } = await testDb().query<StoredModel>(
    `SELECT m.version, m.in_use, m.evaluation, m.suggestable FROM suggestion_models m JOIN workspaces w ON w.id = m.workspace_id WHERE w.slug = 'vellmoor' ORDER BY m.version`,
  );
  expect(rows.length).toBeGreaterThanOrEqual(1);
  await signInAs(page, "trainer@vellmoor.example");
  await page.goto("/gallery");
  await page.getByTestId("gallery-suggestions").click();
  await expect(page).toHaveURL(/\/gallery\/suggestions$/);
  await expect(page.getByRole("heading", { level: 1, name: "Learned suggestions" })).toBeVisible();

  const cards = page.getByTestId("suggestion-model");
  await expect(cards).toHaveCount(rows.length);
  for (const model of rows) {
    const card = page.locator(`[data-testid="suggestion-model"][data-version="${model.version}"]`);
    await expect(card.getByRole("heading", { name: `Model ${model.version}` })).toBeVisible();
    await expect(card.getByTestId("model-in-use")).toHaveCount(model.in_use ? 1 : 0);
    // Each class the model was judged on shows the stored held-out figures (two decimals) and whether it is suggested.
    for (const [defect, figures] of Object.entries(model.evaluation.byClass)) {
      const row = card.locator(`[data-testid="model-class"][data-defect="${defect}"]`);
      const cells = row.locator("td");
      await expect(cells.nth(1)).toHaveText(String(figures.accepted));
      await expect(cells.nth(2)).toHaveText(figures.accepted > 0 ? figures.recall.toFixed(2) : "–");
      await expect(cells.nth(3)).toHaveText(figures.suggested > 0 ? figures.precision.toFixed(2) : "–");
      const suggested = model.suggestable.find((c) => c.defect === defect)?.suggest ?? false;
      await expect(cells.nth(4)).toContainText(suggested ? "Yes" : "No");
    }
  }
  // The seeded model suggests scratch and stain (db/seed/suggestion-model.ts): at least one class says Yes.
  await expect(page.locator('[data-testid="model-class"] td:last-child').filter({ hasText: /^Yes/ }).first()).toBeVisible();
  await expect(page.getByRole("heading", { name: "How models are judged" })).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("suggestions-panel-1440x900.png"), fullPage: true });
});

test("Train now queues a training in the worker and the panel shows how it ended", async ({ page }) => {
  const db = testDb();
  const stamp = `${Date.now()}-${Math.floor(Math.random() * 1e6)}`;
  const password = "train-now-e2e-password";
  const { rows: ws } = await db.query<{ id: string }>("INSERT INTO workspaces (name, slug) VALUES ($1, $2) RETURNING id", [`Train now ${stamp}`, `train-now-${stamp}`]);
  const email = `trainer-${stamp}@train-now.example`;
  const { rows: people } = await db.query<{ id: string }>("INSERT INTO users (workspace_id, email, name, password_hash, roles) VALUES ($1, $2, 'Tamsin Trainer', $3, ARRAY['trainer']) RETURNING id", [
    ws[0].id,
    email,
    await hash(password),
  ]);

  await signInAs(page, email, password);
  await page.goto("/gallery/suggestions");
  await expect(page.getByTestId("suggestion-models-empty")).toBeVisible();
  await page.getByTestId("train-now-button").click();
  // On a quiet machine the worker can finish (nothing to learn) before the page shows the queued
  // message; the page then shows the outcome instead, which the test checks below.
  await expect(page.getByTestId("train-now")).toContainText(/Training in the background|Nothing was trained:/);

  // Queued for this workspace, asked for by this trainer, in the worker's training queue.
  const queued = async () =>
    (
      await db.query<{ state: string }>("SELECT state FROM pgboss.job WHERE name = 'suggestion-training' AND data->>'workspaceId' = $1 AND data->>'requestedBy' = $2", [ws[0].id, people[0].id])
    ).rows.map((row) => row.state);
  await expect.poll(queued, { timeout: 15_000 }).toHaveLength(1);
  // The worker takes it; with no accepted regions it trains nothing, and says why.
  await expect.poll(queued, { timeout: 150_000 }).toEqual(["completed"]);
  await expect(page.getByTestId("train-now-outcome")).toContainText("Nothing was trained:", { timeout: 30_000 });
  await expect(page.getByTestId("train-now-button")).toBeEnabled();
  await expect(page.getByTestId("suggestion-models-empty")).toBeVisible();
});
