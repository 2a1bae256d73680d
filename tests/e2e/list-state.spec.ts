/**
 * List screens keep their filters, sort and page in the URL: back and forward restore them, and a
 * copied link opens the same view in a fresh browser. Fixtures are due in 2099, so they sit behind
 * every unit that other tests take from the queue.
 */
import { expect, test, type Browser, type Page } from "@playwright/test";
import { closeLot, createQueuedLot, createSupplier } from "./db";
import { signInAs } from "./support";

test.describe.configure({ timeout: 120_000 });

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`;

/** A second person's browser, signed in, opening a link someone copied. */
async function openInFreshBrowser(browser: Browser, email: string, url: string) {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signInAs(page, email);
  await page.goto(url);
  return { page, close: () => context.close() };
}

async function expectLotsView(page: Page, { supplierId, refs, pageLabel }: { supplierId: string; refs: string[]; pageLabel: string }) {
  const filters = page.getByRole("search", { name: "Filter lots" });
  await expect(filters.getByLabel("Supplier")).toHaveValue(supplierId);
  await expect(filters.getByLabel("Status")).toHaveValue("open");
  await expect(page.getByRole("navigation", { name: "Lot pages" }).getByLabel("Per page")).toHaveValue("10");
  await expect(page.getByRole("columnheader", { name: /Purchase ref/ })).toHaveAttribute("aria-sort", "ascending");
  await expect(page.getByRole("navigation", { name: "Lot pages" })).toContainText(pageLabel);
  await expect(page.getByTestId("lot-table").locator("tbody tr")).toHaveCount(refs.length);
  for (const [i, ref] of refs.entries()) await expect(page.getByTestId("lot-table").locator("tbody tr").nth(i)).toHaveAttribute("data-testid", `lot-row-${ref}`);
}

test("Lots: filters, sort and page survive back and forward, and a copied link shows the same view", async ({ page, browser }) => {
  const prefix = `LS-${stamp()}`;
  const supplierName = `Listwell Parts ${prefix}`;
  const supplierId = await createSupplier(supplierName);
  // 12 open lots and 2 decided ones: open, 10 per page, by purchase ref → page 2 holds -11 and -12.
  const refs = Array.from({ length: 14 }, (_, i) => `${prefix}-${String(i + 1).padStart(2, "0")}`);
  const lotIds: string[] = [];
  for (const ref of refs) lotIds.push((await createQueuedLot(1, ref, { receivedOn: "2099-12-01", dueOn: "2099-12-31", supplierId })).lotId);
  try {
    await closeLot(lotIds[12]);
    await closeLot(lotIds[13]);

    await signInAs(page, "lead@vellmoor.example");
    await page.goto("/lots");
    const filters = page.getByRole("search", { name: "Filter lots" });
    await filters.getByLabel("Supplier").selectOption({ label: supplierName });
    await expect(page).toHaveURL(new RegExp(`supplierId=${supplierId}`));
    await filters.getByLabel("Status").selectOption("open");
    await page.getByRole("navigation", { name: "Lot pages" }).getByLabel("Per page").selectOption("10");
    await page
      .getByRole("columnheader", { name: /Purchase ref/ })
      .getByRole("button")
      .click();
    await expectLotsView(page, { supplierId, refs: refs.slice(0, 10), pageLabel: "Page 1 of 2" });
    await page.getByRole("button", { name: "Next" }).click();
    await expect(page).toHaveURL(/[?&]page=2(&|$)/);
    await expectLotsView(page, { supplierId, refs: refs.slice(10, 12), pageLabel: "Page 2 of 2" });
    const pageTwo = page.url();

    // Away to a lot and back: the list is as it was left.
    await page.getByRole("link", { name: refs[11] }).click();
    await expect(page.getByRole("heading", { level: 1, name: `Lot ${refs[11]}` })).toBeVisible();
    await page.goBack();
    expect(page.url()).toBe(pageTwo);
    await expectLotsView(page, { supplierId, refs: refs.slice(10, 12), pageLabel: "Page 2 of 2" });
    // One step further back is page 1 of the same filters; forward returns to page 2, then the lot.
    await page.goBack();
    await expectLotsView(page, { supplierId, refs: refs.slice(0, 10), pageLabel: "Page 1 of 2" });
    await page.goForward();
    await expectLotsView(page, { supplierId, refs: refs.slice(10, 12), pageLabel: "Page 2 of 2" });
    await page.goForward();
    await expect(page.getByRole("heading", { level: 1, name: `Lot ${refs[11]}` })).toBeVisible();

    // The copied link, in another lead's fresh browser (server-rendered from the URL alone).
    const fresh = await openInFreshBrowser(browser, "all@vellmoor.example", pageTwo);
    try {
      await expectLotsView(fresh.page, { supplierId, refs: refs.slice(10, 12), pageLabel: "Page 2 of 2" });
    } finally {
      await fresh.close();
    }

    // A link with values that cannot be used falls back and says so, rather than an error page.
    await page.goto(`/lots?supplierId=${supplierId}&page=two&partTypeId=00000000-0000-4000-8000-000000000000`);
    await expect(page.getByTestId("ignored-params")).toContainText("left out: page, part type.");
    await expect(page.getByRole("search", { name: "Filter lots" }).getByLabel("Supplier")).toHaveValue(supplierId);
    await expect(page.getByRole("navigation", { name: "Lot pages" })).toContainText("Page 1 of 1");
  } finally {
    for (const id of lotIds) await closeLot(id);
  }
});

async function expectQueueView(page: Page, { lotId, ref, from, to, pageNumber }: { lotId: string; ref: string; from: number; to: number; pageNumber: number }) {
  await expect(page.getByRole("search", { name: "Filter the queue" }).getByLabel("Lot")).toHaveValue(lotId);
  await expect(page.getByTestId("queue-page")).toHaveText(`Page ${pageNumber}`);
  const rows = page.getByTestId("queue-row");
  await expect(rows).toHaveCount(to - from + 1);
  await expect(rows.first()).toContainText(`${ref}-${from}`);
  await expect(rows.last()).toContainText(`${ref}-${to}`);
}

test("Queue: the lot filter and page survive back and forward, and a copied link shows the same view", async ({ page, browser }) => {
  const ref = `PO-E2E-URL-${stamp()}`;
  // 60 units: page 1 shows 50, page 2 the last 10.
  const { lotId } = await createQueuedLot(60, ref, { receivedOn: "2099-12-01", dueOn: "2099-12-31" });
  try {
    await signInAs(page, "inspector@vellmoor.example");
    await page.goto("/queue");
    await page.getByRole("search", { name: "Filter the queue" }).getByLabel("Lot").selectOption(lotId);
    await expect(page).toHaveURL(new RegExp(`lotId=${lotId}`));
    await expectQueueView(page, { lotId, ref, from: 1, to: 50, pageNumber: 1 });
    await page.getByRole("navigation", { name: "Queue pages" }).getByRole("button", { name: "Next" }).click();
    await expect(page).toHaveURL(/[?&]page=2(&|$)/);
    await expectQueueView(page, { lotId, ref, from: 51, to: 60, pageNumber: 2 });
    const pageTwo = page.url();

    // Away to the lot and back.
    await page.getByTestId("queue-row").first().getByRole("link", { name: ref }).click();
    await expect(page.getByRole("heading", { level: 1, name: `Lot ${ref}` })).toBeVisible();
    await page.goBack();
    expect(page.url()).toBe(pageTwo);
    await expectQueueView(page, { lotId, ref, from: 51, to: 60, pageNumber: 2 });
    await page.goBack();
    await expectQueueView(page, { lotId, ref, from: 1, to: 50, pageNumber: 1 });
    await page.goForward();
    await expectQueueView(page, { lotId, ref, from: 51, to: 60, pageNumber: 2 });
    // Previous walks back from the page's first row.
    await page.getByRole("navigation", { name: "Queue pages" }).getByRole("button", { name: "Previous" }).click();
    await expectQueueView(page, { lotId, ref, from: 1, to: 50, pageNumber: 1 });
    await page.goBack();
    await expectQueueView(page, { lotId, ref, from: 51, to: 60, pageNumber: 2 });

    const fresh = await openInFreshBrowser(browser, "inspector2@vellmoor.example", pageTwo);
    try {
      await expectQueueView(fresh.page, { lotId, ref, from: 51, to: 60, pageNumber: 2 });
    } finally {
      await fresh.close();
    }

    // A closed lot in a link is left out (the list shows every open lot) and the page says so.
    await closeLot(lotId);
    await page.goto(pageTwo);
    await expect(page.getByTestId("ignored-params")).toContainText("lot (closed, or not in this workspace)");
    await expect(page.getByRole("search", { name: "Filter the queue" }).getByLabel("Lot")).toHaveValue("");
  } finally {
    await closeLot(lotId);
  }
});
