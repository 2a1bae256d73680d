import { expect, test, type Page } from "@playwright/test";
import pg from "pg";
import { createBenchUnit, partPhoto, uploadThroughApi } from "./bench-fixtures";
import { signInAs } from "./support";

/**
 * Issue 19's done-when path: an inspector grades a unit; it is drawn for recheck; the auditor
 * takes it, sees no trace of the first grade, marks and grades differently; a lead adjudicates;
 * the unit's grade, the lot page and the inspector's scorecard show the outcome. Screenshots of each
 * new screen at 1440 × 900 and 1024 × 768 go to the test's output folder.
 */
test.describe.configure({ mode: "serial" });

const DEFAULTS = { rate: 0.05, raisedRate: 0.2, minimumPerGrader: 1, iouThreshold: 0.5, meaningfulShare: 0.0005, meaningfulPx: 100, driftAgreement: 0.8, driftWeeks: 4, driftMinRechecks: 5 };

async function signOut(page: Page) {
  const menu = page.getByRole("button", { name: "Menu" });
  if (await menu.isVisible()) await menu.click();
  await page.getByRole("button", { name: "Sign out" }).first().click();
  await expect(page).toHaveURL(/\/sign-in/);
}

async function shots(page: Page, name: string, outputPath: (name: string) => string) {
  for (const [width, height] of [
    [1440, 900],
    [1024, 768],
  ] as const) {
    await page.setViewportSize({ width, height });
    await page.waitForTimeout(300);
    await page.screenshot({ path: outputPath(`${name}-${width}x${height}.png`) });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

test("a graded unit is drawn, rechecked blind, adjudicated by a lead, and the unit, lot and scorecard show the outcome", async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 });
  const inspector = (await pool.query<{ id: string; name: string }>("SELECT id, name FROM users WHERE email = 'inspector@vellmoor.example'")).rows[0];
  const inspectorName = inspector.name;
  try {
    // Every grade of the week is drawn while this test runs (restored at the end).
    await signInAs(page, "lead@vellmoor.example");
    expect((await page.request.put("/api/workspace/recheck-settings", { data: { ...DEFAULTS, rate: 1, raisedRate: 1 } })).status()).toBe(200);
    await signOut(page);

    // The inspector marks a scratch on the lens window (API, as the Bench saves) and grades on the Bench.
    const fixture = await createBenchUnit();
    await signInAs(page, "inspector@vellmoor.example");
    const front = await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "front");
    await uploadThroughApi(page.request, fixture.unitId, await partPhoto(1600, 1200), "back");
    const surface = {
      id: "s1",
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
    const saved = await page.request.put(`/api/photos/${front.id}/regions`, {
      data: { baseVersion: 0, regions: { regions: [{ id: "first-scratch", defect: "scratch", shape: { kind: "rect", x: 420, y: 320, width: 60, height: 40 } }], surfaces: [surface], ruler: null } },
    });
    expect(saved.status()).toBe(200);
    await page.goto(`/units/${fixture.unitId}`);
    const panel = page.getByTestId("grade-panel");
    await panel.getByRole("button", { name: "Measure now" }).click();
    await expect(page.getByTestId("proposed-grade")).toHaveText("B", { timeout: 30_000 });
    await panel.getByLabel("Accept B").check();
    await panel.getByRole("button", { name: "Record grade" }).click();
    await expect(panel).toContainText("Grade B recorded.");
    await signOut(page);

    // It was drawn; oldest first, so it is the one the auditor gets next. Both rates are 1 here, and
    // whether the draw says "raised_rate" depends on the demo inspector's last calibration attempt
    // (the seed's fails; calibration.spec's, if it ran first, may pass), so either reason counts.
    const drawn = await pool.query<{ id: string }>("SELECT id FROM rechecks WHERE unit_id = $1 AND reason IN ('rate', 'raised_rate')", [fixture.unitId]);
    expect(drawn.rows).toHaveLength(1);
    await pool.query("UPDATE rechecks SET created_at = '2000-01-01' WHERE id = $1", [drawn.rows[0].id]);

    // The auditor takes it and sees no trace of the first grade.
    await signInAs(page, "auditor@vellmoor.example");
    await page.goto("/recheck");
    await shots(page, "recheck-queue", (n) => testInfo.outputPath(n));
    await page.getByRole("button", { name: "Take the next recheck" }).click();
    await expect(page).toHaveURL(new RegExp(`/recheck/${drawn.rows[0].id}`));
    const bench = page.getByTestId("recheck-bench");
    await expect(bench).toContainText(fixture.serial);
    await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
    await expect(page.getByTestId("annotation-stage")).toHaveAttribute("data-region-count", "0");
    const html = await page.content();
    expect(html).not.toContain(inspectorName);
    expect(html).not.toContain("first-scratch");
    await shots(page, "recheck-bench", (n) => testInfo.outputPath(n));

    // Marks a dent of its own (a Box; Dent is the first class) on the part's right half in the front photo,
    // away from the lens window, in its separate region set; one dent is under the rubric's count of 2, so
    // its measurement proposes A where the first grade was B.
    await page.getByTestId("tool-box").click();
    const stage = page.getByTestId("annotation-stage");
    const at = async (x: number, y: number) => {
      const [zoom, ox, oy] = await Promise.all(["data-zoom", "data-offset-x", "data-offset-y"].map(async (name) => Number(await stage.getAttribute(name))));
      const box = (await stage.boundingBox())!;
      return { x: box.x + ox + x * zoom, y: box.y + oy + y * zoom };
    };
    const [from, to] = [await at(900, 480), await at(980, 550)];
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    await page.mouse.move(to.x, to.y, { steps: 6 });
    await page.mouse.up();
    await expect(stage).toHaveAttribute("data-region-count", "1");
    await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
    const own = await pool.query<{ payload: { regions: { defect: string; shape: { kind: string } }[] } }>("SELECT payload FROM recheck_region_sets WHERE recheck_id = $1", [drawn.rows[0].id]);
    expect(own.rows.flatMap((row) => row.payload.regions.map((r) => [r.defect, r.shape.kind]))).toEqual([["dent", "rect"]]);
    await page.getByRole("button", { name: "Measure", exact: true }).click();
    await expect(page.getByTestId("recheck-proposal")).toHaveText("A", { timeout: 30_000 });
    await page.getByRole("button", { name: "Submit my grade" }).click();
    await expect(page.getByTestId("recheck-outcome")).toContainText("sent to adjudication");
    await shots(page, "recheck-outcome", (n) => testInfo.outputPath(n));
    await signOut(page);

    // The lead settles it: the recheck stands.
    await signInAs(page, "lead@vellmoor.example");
    await page.goto(`/recheck/adjudications/${drawn.rows[0].id}`);
    const screen = page.getByTestId("adjudication");
    await expect(screen).toContainText("First grade");
    // Both region sets are there to compare: the first grader's scratch and the auditor's dent, on the front photo.
    await expect(screen).toContainText("First grade's regions (1)");
    await expect(screen).toContainText("Recheck's regions (1)");
    // Classes and views by the part type's names, not its keys.
    await expect(screen.getByRole("heading", { name: "Photo: Front" })).toBeVisible();
    await expect(screen.getByRole("rowheader", { name: "Scratch", exact: true })).toBeVisible();
    await expect(screen.getByRole("rowheader", { name: "Dent", exact: true })).toBeVisible();
    await shots(page, "adjudication", (n) => testInfo.outputPath(n));
    await page.getByLabel("The recheck (A)").check();
    await page.getByLabel("Reason").fill("The first mark is on the card, not on the part.");
    await page.getByRole("button", { name: "Record the decision" }).click();
    await expect(page.getByTestId("adjudication-done")).toContainText("A is now the unit's grade");

    // The unit's grade and the lot page follow.
    const grades = (await (await page.request.get(`/api/units/${fixture.unitId}/grades`)).json()) as { current: { kind: string; finalGrade: string } };
    expect(grades.current).toMatchObject({ kind: "adjudication", finalGrade: "A" });
    const lotId = (await pool.query<{ lot_id: string }>("SELECT lot_id FROM units WHERE id = $1", [fixture.unitId])).rows[0].lot_id;
    await page.goto(`/lots/${lotId}`);
    await expect(page.getByTestId("unit-grade-1")).toHaveText("A");

    // The inspector's scorecard counts the recheck (graded B, rechecked A) in this week's row.
    await page.goto("/recheck/scorecards");
    await expect(page.getByTestId(`scorecard-row-${inspector.id}`)).toContainText(inspectorName);
    await expect(page.getByTestId("scorecard-trend-chart").locator("svg.recharts-surface")).toBeVisible();
    await shots(page, "scorecards-team", (n) => testInfo.outputPath(n));
    await page.getByTestId(`scorecard-row-${inspector.id}`).getByRole("link", { name: inspectorName }).click();
    await expect(page).toHaveURL(new RegExp(`grader=${inspector.id}`));
    await expect(page.getByRole("heading", { name: `${inspectorName}: weekly trend` })).toBeVisible();
    const thisWeek = page.getByTestId("scorecard-weeks").locator("tbody tr").last();
    expect(Number(await thisWeek.locator("td").first().textContent())).toBeGreaterThanOrEqual(1);
    await expect(page.getByTestId(`scorecard-row-${inspector.id}`).locator("td").nth(1)).not.toHaveText("0");
    await shots(page, "scorecards-grader", (n) => testInfo.outputPath(n));
    const csv = await page.request.get("/api/recheck/scorecards/csv");
    expect(csv.headers()["content-type"]).toMatch(/^text\/csv/);
    expect(await csv.text()).toContain(inspectorName);
  } finally {
    await page.request.put("/api/workspace/recheck-settings", { data: DEFAULTS }).catch(() => {});
    await pool.end();
  }
});
