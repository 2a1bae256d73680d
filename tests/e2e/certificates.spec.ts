/**
 * Condition certificates in the browser: an inspector grades a unit, a lead issues a certificate
 * on its Bench, the QR code's address opens the verification page signed out (a fresh browser
 * context, no cookies), the short code typed into /verify finds the same certificate, and after
 * the lead revokes it both say revoked. Screenshots at 1440×900 and 1024×768 go to the test's
 * output folder.
 */
import { expect, test, type Page } from "@playwright/test";
import { createGradableUnit } from "./grading-fixtures";
import { signInAs } from "./support";

test.describe.configure({ timeout: 150_000 });

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

test("a lead certifies a graded unit; the QR link and the short code verify it signed out until it is revoked", async ({ page, browser }) => {
  const fixture = await createGradableUnit("lead@vellmoor.example");

  await signInAs(page, "inspector@vellmoor.example");
  await page.goto(`/units/${fixture.unitId}`);
  await page.getByRole("button", { name: "Measure now" }).click();
  await expect(page.getByTestId("proposed-grade")).toHaveText("C");
  await page.getByLabel("Accept C").check();
  await page.getByRole("button", { name: "Record grade" }).click();
  await expect(page.getByTestId("current-grade")).toContainText("under rubric version 1");
  // Inspectors do not issue certificates.
  await expect(page.getByTestId("unit-certificates")).toHaveCount(0);
  await page.context().clearCookies();

  await signInAs(page, "lead@vellmoor.example");
  await page.goto(`/units/${fixture.unitId}`);
  const panel = page.getByTestId("unit-certificates");
  await panel.getByRole("button", { name: "Issue certificate" }).click();
  const row = panel.locator("li").first();
  await expect(row).toContainText("grade C");
  await expect(row).toContainText("valid");
  const shortCode = (await row.locator(".font-mono").first().textContent())!.trim();
  expect(shortCode).toMatch(/^[0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z]{3}$/);
  await row.scrollIntoViewIfNeeded();
  await shoot(page, "unit-certificates");
  const pdf = await page.request.get((await row.getByRole("link", { name: "PDF" }).getAttribute("href"))!);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  const verificationUrl = (await row.getByTestId("verification-link").getAttribute("href"))!;

  // A buyer's phone: no session at all.
  const buyer = await browser.newContext();
  const phone = await buyer.newPage();
  await phone.goto(new URL(verificationUrl).pathname);
  await expect(phone.getByTestId("verification-ok")).toBeVisible();
  await expect(phone.getByTestId("verified-grade")).toHaveText("C");
  await expect(phone.getByText(fixture.serial)).toBeVisible();
  await expect(phone.getByRole("navigation")).toHaveCount(0);
  await shoot(phone, "verify-valid");

  await phone.goto("/verify");
  await phone.getByRole("textbox", { name: "Certificate code" }).fill(shortCode.toLowerCase().replaceAll("-", " "));
  await phone.getByRole("button", { name: "Check" }).click();
  await expect(phone).toHaveURL(/\/verify\?code=/);
  await expect(phone.getByTestId("verified-grade")).toHaveText("C");

  // A tampered link: one plain sentence.
  const tampered = verificationUrl.slice(0, -3) + (verificationUrl.endsWith("AAA") ? "BBB" : "AAA");
  await phone.goto(new URL(tampered).pathname);
  await expect(phone.getByTestId("verification-refused")).toContainText("not valid");

  // The lead revokes it with a reason; both ways in now say revoked.
  await row.getByRole("button", { name: "Revoke…" }).click();
  await row.getByLabel("Why is it revoked?").fill("The unit came back with a cracked lens.");
  await row.getByRole("button", { name: "Revoke certificate" }).click();
  await expect(row).toContainText("revoked");
  await expect(row).toContainText("The unit came back with a cracked lens.");
  await phone.goto(new URL(verificationUrl).pathname);
  await expect(phone.getByTestId("verification-refused")).toHaveAttribute("data-reason", "revoked");
  await expect(phone.getByText("was revoked by its issuer")).toBeVisible();
  await shoot(phone, "verify-revoked");
  await buyer.close();
});
