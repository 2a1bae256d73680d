import { expect, test } from "@playwright/test";
import { closeLot, createUrgentLot, testDb } from "./db";
import { signInAs } from "./support";

test("two inspectors press Take next at once and get different units; an expired lease is offered again", async ({ browser }) => {
  const { lotId, unitIds } = await createUrgentLot(2);
  const [one, two] = [await browser.newContext(), await browser.newContext()];
  try {
    const [p1, p2] = [await one.newPage(), await two.newPage()];
    await signInAs(p1, "inspector@vellmoor.example");
    await signInAs(p2, "inspector2@vellmoor.example");
    await Promise.all([p1.goto("/queue"), p2.goto("/queue")]);
    await Promise.all([p1.getByTestId("take-next").click(), p2.getByTestId("take-next").click()]);
    await Promise.all([p1.waitForURL(/\/units\/[0-9a-f-]{36}/), p2.waitForURL(/\/units\/[0-9a-f-]{36}/)]);
    const got1 = p1.url().split("/units/")[1].slice(0, 36);
    const got2 = p2.url().split("/units/")[1].slice(0, 36);
    expect(got1).not.toBe(got2);
    expect(unitIds.sort()).toEqual([got1, got2].sort());

    // The first inspector closes the tab; their lease runs out (shortened here instead of waiting 20 minutes).
    await one.close();
    await testDb().query("UPDATE units SET lease_expires_at = now() - interval '1 second' WHERE id = $1", [got1]);
    await p2.goto("/queue");
    await expect(p2.getByTestId("queue-table")).toContainText("waiting");
    await p2.getByTestId("take-next").click();
    await p2.waitForURL(new RegExp(`/units/${got1}`));
  } finally {
    await two.close();
    await closeLot(lotId);
  }
});

test("the queue lists who has which unit on the bench", async ({ page }) => {
  const { lotId } = await createUrgentLot(1, `PO-E2E-LIST-${Date.now()}`);
  try {
    await signInAs(page, "inspector@vellmoor.example");
    await page.goto("/queue");
    await page.getByTestId("take-next").click();
    await page.waitForURL(/\/units\//);
    await page.goto("/queue");
    await expect(page.getByTestId("queue-row").first()).toContainText("Ines Kaltenbrunn, for 0 min");
    await expect(page.getByTestId("queue-stats")).toContainText("On a bench");
  } finally {
    await closeLot(lotId);
  }
});
