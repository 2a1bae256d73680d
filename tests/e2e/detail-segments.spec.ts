/**
 * Detail pages (lots, units, part types, suppliers) answer a wrong id, or another workspace's,
 * with their own not-found inside the app's frame — never a 500 or the bare 404 page.
 */
import { expect, test } from "@playwright/test";
import { testDb } from "./db";
import { signInAs } from "./support";

test("a mistyped id or another workspace's id shows the segment's not-found, with the way back", async ({ page, browser }) => {
  // Rows of the demo company (Vellmoor), opened by the second company's lead.
  const { rows } = await testDb().query(
    `SELECT (SELECT l.id FROM lots l WHERE l.workspace_id = w.id LIMIT 1) AS lot,
            (SELECT u.id FROM units u WHERE u.workspace_id = w.id LIMIT 1) AS unit,
            (SELECT p.id FROM part_types p WHERE p.workspace_id = w.id LIMIT 1) AS part_type,
            (SELECT s.id FROM suppliers s WHERE s.workspace_id = w.id LIMIT 1) AS supplier
     FROM workspaces w WHERE w.slug = 'vellmoor'`,
  );
  const other = rows[0] as { lot: string; unit: string; part_type: string; supplier: string };
  const cases = [
    { path: `/lots/${other.lot}`, what: "lot", back: "Back to Lots", href: "/lots" },
    { path: "/lots/PO-24-0611", what: "lot", back: "Back to Lots", href: "/lots" },
    { path: `/units/${other.unit}`, what: "unit", back: "Back to the Queue", href: "/queue" },
    { path: "/units/00000000-0000-4000-8000-000000000000", what: "unit", back: "Back to the Queue", href: "/queue" },
    { path: `/part-types/${other.part_type}`, what: "part type", back: "Back to Part types", href: "/part-types" },
    { path: `/suppliers/${other.supplier}`, what: "supplier", back: "Back to Suppliers", href: "/suppliers" },
  ];
  await signInAs(page, "lead@quillfen.example");
  for (const c of cases) {
    await page.goto(c.path);
    // Inside the signed-in frame (the Bench's frame for a unit), not the bare 404 page.
    const notFound = page.locator("[data-shell] #main").getByTestId("detail-not-found");
    await expect(notFound.getByRole("heading", { level: 1 }), c.path).toHaveText(`No such ${c.what}`);
    await expect(notFound.getByRole("link", { name: c.back })).toHaveAttribute("href", c.href);
  }
  // The same row opens for its own company.
  const own = await browser.newContext();
  try {
    const ownPage = await own.newPage();
    await signInAs(ownPage, "lead@vellmoor.example");
    await ownPage.goto(`/lots/${other.lot}`);
    await expect(ownPage.getByRole("heading", { level: 1, name: /^Lot / })).toBeVisible();
    await expect(ownPage.getByTestId("detail-not-found")).toHaveCount(0);
  } finally {
    await own.close();
  }
});
