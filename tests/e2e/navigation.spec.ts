import { expect, test } from "@playwright/test";
import { navLabels, signInAs } from "./support";

// What each demo role should see in the navigation (leads see every screen; Outbox while the
// local inbox is the mail transport, as in the test run).
const EXPECTED: Record<string, string[]> = {
  "inspector@vellmoor.example": ["Queue", "Lots", "Gallery", "Calibration", "Part types"],
  "trainer@vellmoor.example": ["Gallery", "Calibration", "Rubrics", "Part types"],
  "auditor@vellmoor.example": ["Lots", "Gallery", "Recheck", "Rubrics", "Suppliers", "Part types", "Reports"],
  "lead@vellmoor.example": ["Queue", "Lots", "Gallery", "Calibration", "Recheck", "Rubrics", "Suppliers", "Part types", "Reports", "People", "Outbox"],
};

for (const [email, screens] of Object.entries(EXPECTED)) {
  test(`${email.split("@")[0]} sees only their screens`, async ({ page }) => {
    await signInAs(page, email);
    expect(await navLabels(page)).toEqual(screens);
    for (const label of screens) {
      await page.getByRole("navigation", { name: "Main" }).first().getByRole("link", { name: label }).click();
      await expect(page.getByRole("heading", { level: 1, name: label })).toBeVisible();
    }
  });
}

test("a screen outside the role shows the 403 page, and sign-out ends the session", async ({ page }) => {
  await signInAs(page, "inspector@vellmoor.example");
  // The page streams under loading.tsx, so the HTTP status is already sent; the content is the 403 page.
  await page.goto("/people");
  await expect(page.getByTestId("forbidden")).toBeVisible();
  await expect(page.getByTestId("invite-form")).toHaveCount(0);
  await page.goto("/");
  await page.getByRole("button", { name: "Sign out" }).first().click();
  await expect(page).toHaveURL(/\/sign-in/);
  await page.goto("/queue");
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Fqueue/);
});

test("navigation works on a phone-size screen", async ({ browser }) => {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("trainer@vellmoor.example");
  await page.getByLabel("Password").fill("partproof-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.getByRole("button", { name: "Menu" }).click();
  await page.locator("#mobile-nav").getByRole("link", { name: "Rubrics" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Rubrics" })).toBeVisible();
  await context.close();
});
