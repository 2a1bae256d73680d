import { expect, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "partproof-demo";

/** Signs in through the form, as a person would. */
export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-user").first()).toBeVisible();
}

export async function navLabels(page: Page): Promise<string[]> {
  const nav = page.getByRole("navigation", { name: "Main" }).first();
  return (await nav.getByRole("link").allInnerTexts()).map((t) => t.replace(/\s*planned\s*$/i, "").trim());
}
