import { expect, test, type Page } from "@playwright/test";
import { createGradableUnit } from "./grading-fixtures";
import { signInAs } from "./support";

test.describe.configure({ mode: "serial" });

async function signOut(page: Page) {
  // On the Bench (a workspace screen) the navigation, Sign out with it, sits behind the menu.
  const menu = page.getByRole("button", { name: "Menu" });
  if (await menu.isVisible()) await menu.click();
  await page.getByRole("button", { name: "Sign out" }).first().click();
  await expect(page).toHaveURL(/\/sign-in/);
}

test("a lead publishes rubric version 2; a unit graded under version 1 keeps its grade and shows what version 2 would say", async ({ page }) => {
  const fixture = await createGradableUnit("lead@vellmoor.example");

  // The inspector measures the unit and accepts the proposal under version 1.
  await signInAs(page, "inspector@vellmoor.example");
  await page.goto(`/units/${fixture.unitId}`);
  await expect(page.getByRole("heading", { level: 1, name: fixture.serial })).toBeVisible();
  await page.getByRole("button", { name: "Measure now" }).click();
  await expect(page.getByTestId("proposed-grade")).toHaveText("C");
  await expect(page.getByTestId("proposal-lines")).toContainText("scratch covers 1.2 % of lens window > 1.0 % allowed for B → C");
  // An override without a final grade names only the grades the form offers (not the proposed C).
  await page.getByLabel("Override").check();
  await page.getByRole("button", { name: "Record grade" }).click();
  await expect(page.getByText("Choose the final grade: A, B or Reject.")).toBeVisible();
  // An override without a reason is refused in the form.
  await page.getByLabel("Final grade").selectOption("B");
  await page.getByRole("button", { name: "Record grade" }).click();
  await expect(page.getByText("An override needs a reason")).toBeVisible();
  await page.getByLabel("Accept C").check();
  await page.getByRole("button", { name: "Record grade" }).click();
  await expect(page.getByTestId("current-grade")).toContainText("under rubric version 1");
  await signOut(page);

  // The lead drafts version 2 on the Rubrics screen, tries it on a sample, and publishes it.
  await signInAs(page, "lead@vellmoor.example");
  await page.goto(`/rubrics?partType=${fixture.partTypeId}`);
  await expect(page.getByRole("heading", { level: 1, name: "Rubrics" })).toBeVisible();
  await expect(page.getByLabel("Part type")).toHaveValue(fixture.partTypeId);
  await page.getByRole("button", { name: "Open a draft from version 1" }).click();
  const editor = page.getByTestId("rubric-editor");
  await expect(editor.getByRole("heading", { name: "Draft version 2" })).toBeVisible();

  // Live preview: 1.5 % of scratch on the lens window is C under the copied rules…
  await page.getByLabel("scratch on lens window — share, %").fill("1.5");
  await expect(page.getByTestId("preview-grade")).toHaveText("C");
  // …a bad threshold shows the library's message and pauses the preview…
  // Saved rules read as sentences; "Edit" opens one.
  await expect(page.getByTestId("rule-row-1")).toContainText("scratch on lens window, share > 1.0 %");
  await page.getByRole("button", { name: "Edit rule 2", exact: true }).click();
  const cThreshold = page.getByTestId("rule-row-1").getByLabel("Threshold (%)");
  await cThreshold.fill("-1");
  await expect(page.getByTestId("rule-row-1")).toContainText("cannot be negative");
  await expect(page.getByTestId("rubric-errors")).toContainText('Rule 2 ("lens-scratch-c"), threshold: cannot be negative');
  // …and raising C's limit to 2 % makes the same sample a B, as the trainer types.
  await cThreshold.fill("2");
  await expect(page.getByTestId("preview-grade")).toHaveText("B");
  await expect(page.getByTestId("preview-lines")).toContainText("scratch covers 1.5 % of lens window > 0.5 % allowed for A → B");

  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByText("Draft version 2 saved.")).toBeVisible();
  await expect(page.getByTestId("rubric-diff-changes")).toContainText("scratch on lens window: threshold for C changed from 1.0 % to 2.0 %");
  await page.getByRole("button", { name: "Publish version 2…" }).click();
  await page.getByRole("button", { name: "Publish version 2", exact: true }).click();
  const versions = page.getByTestId("rubric-versions");
  await expect(versions.getByRole("button", { name: /Version 2\s*published/ })).toBeVisible();
  await expect(page.getByTestId("rubric-rules")).toContainText("scratch on lens window, share > 2.0 %");

  // The unit keeps its version-1 grade, and shows what version 2 would say.
  await page.goto(`/units/${fixture.unitId}`);
  const current = page.getByTestId("current-grade");
  await expect(current).toContainText("C");
  await expect(current).toContainText("under rubric version 1");
  const whatIf = page.getByTestId("grade-what-if");
  await expect(whatIf.getByLabel("Rubric version")).toHaveValue("2");
  await expect(page.getByTestId("what-if-grade")).toHaveText("B");
  await expect(page.getByTestId("what-if-lines")).toContainText("scratch covers 1.2 % of lens window > 0.5 % allowed for A → B");
  await expect(whatIf).toContainText("stays as it is");
  await whatIf.getByLabel("Rubric version").selectOption("1");
  await expect(page.getByTestId("what-if-grade")).toHaveText("C");
  await expect(page.getByTestId("grade-history").locator("ol > li")).toHaveCount(1);
});

test("an auditor reads rubrics but cannot edit or publish them", async ({ page }) => {
  const fixture = await createGradableUnit("lead@vellmoor.example");
  await signInAs(page, "auditor@vellmoor.example");
  await page.goto(`/rubrics?partType=${fixture.partTypeId}`);
  await expect(page.getByTestId("rubric-rules")).toContainText("scratch on lens window, share > 1.0 %");
  await expect(page.getByRole("button", { name: /Open a draft/ })).toHaveCount(0);
  await expect(page.getByTestId("rubric-editor")).toHaveCount(0);
  // The sample preview works read-only too.
  await page.getByLabel("scratch on lens window — share, %").fill("0.7");
  await expect(page.getByTestId("preview-grade")).toHaveText("B");
});
