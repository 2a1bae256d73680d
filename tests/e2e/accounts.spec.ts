import { expect, test } from "@playwright/test";
import { latestLinkTo } from "../support/inbox";
import { signInAs } from "./support";

test("a wrong password shows a clear message and no session", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("auditor@vellmoor.example");
  await page.getByLabel("Password").fill("definitely-wrong");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.locator("form").getByRole("alert")).toHaveText("The e-mail address or password is not right.");
  await page.goto("/");
  await expect(page).toHaveURL(/\/sign-in/);
});

test("the sign-in form checks input before sending", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByText("Enter an e-mail address.")).toBeVisible();
  await expect(page.getByText("Enter your password.")).toBeVisible();
});

test("sign-up e-mails a link; following it creates a company workspace with its first lead, starter part types and a guided first day", async ({ page }) => {
  const email = `founder.${Date.now()}@e2e.example`;
  await page.goto("/sign-up");
  await page.getByLabel("Company").fill("Pellwick Refurb Desk");
  await page.getByLabel("Your name").fill("Pia Pellwick");
  await page.getByLabel("Work e-mail").fill(email);
  // Every starter is ticked; this desk handles no loudspeakers.
  await expect(page.getByTestId("starter-choices").getByRole("checkbox")).toHaveCount(8);
  await page.getByLabel(/Loudspeaker/).uncheck();
  await page.getByRole("button", { name: "Create workspace" }).click();
  await expect(page.getByTestId("sign-up-sent")).toContainText(`Check your inbox: we have sent a message to ${email}`);

  // The confirmation reaches the local inbox (sign-up mail belongs to no workspace's Outbox yet).
  await page.goto(await latestLinkTo(email, 10_000));
  await page.getByLabel("New password").fill("pellwick-password");
  await page.getByLabel("Repeat the password").fill("pellwick-password");
  await page.getByRole("button", { name: "Set password" }).click();
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("pellwick-password");
  await page.getByRole("button", { name: "Sign in" }).click();

  // Home lists the first day's steps: part types done, rubrics still drafts, no supplier or lot yet.
  await expect(page.getByRole("heading", { level: 1, name: "Good to see you, Pia" })).toBeVisible();
  const steps = page.getByTestId("getting-started");
  await expect(steps.getByTestId("setup-step-part-types")).toHaveAttribute("data-done", "true");
  await expect(steps.getByTestId("setup-step-rubrics")).toHaveAttribute("data-done", "false");
  await expect(steps.getByTestId("setup-step-suppliers")).toHaveAttribute("data-done", "false");

  await page.goto("/part-types");
  await expect(page.getByTestId("part-type-table").getByRole("row")).toHaveCount(8); // header + 7
  await expect(page.getByTestId("part-type-table")).not.toContainText("Loudspeaker");
  await page.goto("/rubrics");
  await expect(page.getByTestId("rubrics-unpublished")).toContainText("7 of 7 part types have no published rubric");
  await expect(page.getByTestId("rubric-notes")).toContainText("Example rubric to adapt");

  // Receiving a lot says what is missing instead of offering empty drop-downs.
  await page.goto("/lots/new");
  await expect(page.getByTestId("receive-lot-empty")).toContainText("there is no active supplier yet");
  await expect(page.getByTestId("receive-lot-empty").getByRole("link", { name: "Add a supplier" })).toHaveAttribute("href", "/suppliers");
  await expect(page.getByLabel("Supplier")).toHaveCount(0);

  await page.goto("/people");
  await expect(page.getByTestId("people-table")).toContainText(email);
  await expect(page.getByTestId("people-table")).not.toContainText("vellmoor.example");
  // One time zone for the whole workspace, named once beside the user's name.
  await expect(page.getByTestId("time-zone-note").first()).toHaveText("Times in UTC");
  const settings = page.getByTestId("workspace-settings");
  await settings.getByLabel("Time zone").selectOption("Europe/Berlin");
  await settings.getByRole("button", { name: "Save time zone" }).click();
  await expect(settings.getByRole("status")).toContainText("Times are now shown in Europe/Berlin");
  await expect(page.getByTestId("time-zone-note").first()).toContainText("Times in Europe/Berlin (UTC+0");
});

test("a lead invites a colleague, who sets a password from the e-mail and signs in", async ({ page, browser }) => {
  const email = `newhire.${Date.now()}@e2e.example`;
  await signInAs(page, "lead@vellmoor.example");
  await page.goto("/people");
  const form = page.getByTestId("invite-form");
  await form.getByLabel("Name").fill("Nell Newhire");
  await form.getByLabel("E-mail").fill(email);
  await form.getByLabel("Auditor").check();
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(form.getByRole("status")).toContainText(`Invitation sent to ${email}`);
  await expect(page.getByTestId(`person-${email}`)).toContainText("Invited");

  // The lead opens the message in the Outbox and follows the link in a fresh browser.
  await page.getByRole("navigation", { name: "Main" }).first().getByRole("link", { name: "Outbox" }).click();
  await page
    .getByRole("row", { name: new RegExp(email) })
    .getByRole("link")
    .click();
  // The Outbox shows the message's web address as a link.
  const link = (await page
    .getByTestId("message-text")
    .getByRole("link", { name: /\/set-password\?token=/ })
    .getAttribute("href"))!;
  expect(link).toMatch(/^https?:\/\/\S+\/set-password\?token=\S+$/);

  const context = await browser.newContext();
  const invitee = await context.newPage();
  await invitee.goto(link);
  await invitee.getByLabel("New password").fill("nell-newhire-pass");
  await invitee.getByLabel("Repeat the password").fill("nell-newhire-pass");
  await invitee.getByRole("button", { name: "Set password" }).click();
  await expect(invitee.getByText("Your password is set.")).toBeVisible();
  await invitee.getByLabel("E-mail").fill(email);
  await invitee.getByLabel("Password").fill("nell-newhire-pass");
  await invitee.getByRole("button", { name: "Sign in" }).click();
  await expect(invitee.getByTestId("signed-in-user").first()).toContainText("Nell Newhire");
  await context.close();
});

test("duplicate e-mail on the invite form is reported beside the field", async ({ page }) => {
  await signInAs(page, "lead@vellmoor.example");
  await page.goto("/people");
  const form = page.getByTestId("invite-form");
  await form.getByLabel("Name").fill("Copy Person");
  await form.getByLabel("E-mail").fill("trainer@vellmoor.example");
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(form.locator("#invite-email-error")).toHaveText("Someone in your workspace already uses this e-mail address.");
});
