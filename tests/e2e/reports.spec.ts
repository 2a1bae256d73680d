/**
 * The Reports screen as an auditor uses it: filters applied through the form land in the URL (back
 * restores them), a lot's report opens as a page, and the CSV export for the filter downloads.
 * Screenshots at 1440×900 and 1024×768 go to the test's output folder.
 */
import { expect, test, type Page } from "@playwright/test";
import { createQueuedLot, createSupplier, testDb } from "./db";
import { signInAs } from "./support";

test.describe.configure({ timeout: 120_000 });

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`;

async function shoot(page: Page, name: string) {
  for (const [width, height] of [
    [1440, 900],
    [1024, 768],
  ]) {
    await page.setViewportSize({ width, height });
    await page.screenshot({ path: test.info().outputPath(`${name}-${width}x${height}.png`), fullPage: true });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

test("an auditor filters the reports, opens a lot report and goes back to the same filter", async ({ page }) => {
  const tag = stamp();
  const supplierName = `Reports Supplier ${tag}`;
  const supplierId = await createSupplier(supplierName);
  const ref = `PO-RPT-${tag}`;
  const { lotId } = await createQueuedLot(3, ref, { receivedOn: "2026-10-14", dueOn: "2099-01-01", supplierId });
  // Decided as a lead would (out of the queue, so other tests never meet its units).
  await testDb().query("UPDATE lots SET status = 'decided', verdict = 'reject', disposition = 'return_to_vendor', disposition_reason = 'Scratched lenses.', decided_at = now() WHERE id = $1", [lotId]);

  await signInAs(page, "auditor@vellmoor.example");
  await page.goto("/reports");
  await expect(page.getByRole("heading", { name: "Reports", level: 1 })).toBeVisible();
  await shoot(page, "reports-all");

  const filters = page.getByRole("search", { name: "Filter reports" });
  await filters.getByLabel("Supplier").selectOption(supplierId);
  await filters.getByLabel("From", { exact: true }).fill("2026-10-01");
  await filters.getByLabel("To", { exact: true }).fill("2026-10-31");
  await filters.getByRole("button", { name: "Apply filters" }).click();
  await expect(page).toHaveURL(new RegExp(`supplierId=${supplierId}`));
  await expect(page).toHaveURL(/from=2026-10-01&to=2026-10-31/);
  const lots = page.getByTestId("report-lots");
  await expect(lots.locator("tbody tr")).toHaveCount(1);
  await expect(lots).toContainText(ref);
  await expect(page.getByTestId("report-scorecards")).toContainText(supplierName);
  await expect(page.getByTestId("export-units")).toHaveAttribute("href", `/api/reports/export?kind=units&supplierId=${supplierId}&from=2026-10-01&to=2026-10-31`);
  await shoot(page, "reports-filtered");

  // The export for this filter: the lot's three units, nothing else.
  const csv = await page.request.get(`/api/reports/export?kind=units&supplierId=${supplierId}`);
  expect(csv.status()).toBe(200);
  const lines = (await csv.text()).trim().split("\r\n");
  expect(lines).toHaveLength(4);
  expect(lines.slice(1).every((line) => line.includes(ref))).toBe(true);

  await lots.getByRole("link", { name: `Report of lot ${ref}`, exact: true }).click();
  await expect(page).toHaveURL(new RegExp(`/reports/lots/${lotId}`));
  await expect(page.getByRole("heading", { level: 1 })).toContainText(ref);
  await expect(page.getByTestId("report-units").locator("tbody tr")).toHaveCount(3);
  await shoot(page, "lot-report");

  await page.goBack();
  await expect(page).toHaveURL(new RegExp(`supplierId=${supplierId}`));
  await expect(filters.getByLabel("Supplier")).toHaveValue(supplierId);
  await expect(filters.getByLabel("From", { exact: true })).toHaveValue("2026-10-01");
});

test("a link with a bad value says so and shows the default; an unknown lot report is not found", async ({ page }) => {
  await signInAs(page, "lead@vellmoor.example");
  await page.goto("/reports?from=2026-02-30&period=fortnight");
  await expect(page.getByTestId("ignored-params")).toContainText("first day");
  await expect(page.getByTestId("ignored-params")).toContainText("period");
  await expect(page.getByRole("search", { name: "Filter reports" }).getByLabel("Grades per")).toHaveValue("month");
  await page.goto("/reports/lots/00000000-0000-4000-8000-000000000000");
  await expect(page.getByTestId("detail-not-found")).toContainText("No such lot");
});

test("inspectors and trainers do not see Reports", async ({ page }) => {
  await signInAs(page, "inspector@vellmoor.example");
  await page.goto("/reports");
  await expect(page.getByTestId("forbidden")).toBeVisible();
  await expect(page.getByRole("heading", { name: "Reports", level: 1 })).toHaveCount(0);
});
