import { expect, test, type Page } from "@playwright/test";
import sharp from "sharp";
import { createPhotoBenchUnit, nearestQuadrant, orientedPhoto } from "./photo-fixtures";
import { signInAs } from "./support";

const file = (name: string, buffer: Buffer, mimeType = "image/jpeg") => ({ name, mimeType, buffer });

/** Picks files as a person would: once the uploader takes them (its picker is disabled until the page has hydrated). */
async function chooseFiles(page: Page, files: ReturnType<typeof file>[]): Promise<void> {
  const picker = page.getByTestId("photo-file-input");
  await expect(picker).toBeEnabled();
  await picker.setInputFiles(files);
}

/** Reads the batch bar's value every few milliseconds until it reaches 100; returns what it saw. */
async function watchBatchProgress(page: Page): Promise<number[]> {
  return page.evaluate(
    () =>
      new Promise<number[]>((resolve) => {
        const seen: number[] = [];
        const timer = setInterval(() => {
          const bar = document.querySelector('[data-testid="batch-progress"] [role="progressbar"]');
          const value = Number(bar?.getAttribute("aria-valuenow") ?? "-1");
          if (value >= 0 && seen.at(-1) !== value) seen.push(value);
          if (value === 100) {
            clearInterval(timer);
            resolve(seen);
          }
        }, 20);
        setTimeout(() => {
          clearInterval(timer);
          resolve(seen);
        }, 60_000);
      }),
  );
}

test("an inspector uploads 10 photos at once, watches the progress, and sees each turn ready with upright thumbnails", async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  const unitId = await createPhotoBenchUnit();
  const orientations = [1, 6, 1, 3, 1, 8, 1, 6, 1, 1] as const;
  const files = await Promise.all(orientations.map(async (o, i) => file(`bench-${i + 1}-exif${o}.jpg`, await orientedPhoto(i, o))));

  await signInAs(page, "inspector@vellmoor.example");
  // The old photos link lands on the Bench, where the photos now live.
  await page.goto(`/units/${unitId}/photos`);
  await expect(page).toHaveURL(new RegExp(`/units/${unitId}#photos$`));
  await expect(page.getByRole("heading", { level: 1 })).toContainText("CAM-");
  await chooseFiles(page, files);
  await expect(page.getByTestId("upload-row")).toHaveCount(10);
  // Views are suggested in order (required first), and each can be changed before uploading.
  const firstView = page.getByLabel("View of bench-1-exif1.jpg");
  await expect(firstView).toHaveValue("front");
  await expect(page.getByLabel("View of bench-2-exif6.jpg")).toHaveValue("back");
  await page.getByLabel("View of bench-10-exif1.jpg").selectOption("connector");

  // A slow uplink, so the progress can be watched (Chromium's own network throttling).
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 1_000_000 });
  const watching = watchBatchProgress(page);
  await page.getByRole("button", { name: "Upload 10 photos" }).click();
  await expect(page.getByRole("progressbar")).toHaveCount(11); // one per file and one for the batch
  const seen = await watching;
  expect(
    seen.some((v) => v > 0 && v < 100),
    `batch progress values seen: ${seen.join(", ")}`,
  ).toBe(true);
  expect(seen.at(-1)).toBe(100);
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

  const cards = page.getByTestId("photo-card");
  await expect(cards).toHaveCount(10, { timeout: 60_000 });
  await expect(page.locator('[data-testid="photo-card"][data-status="ready"]')).toHaveCount(10, { timeout: 60_000 });
  await expect(page.getByTestId("batch-progress")).toContainText("10 of 10 uploaded");
  for (const row of await page.getByTestId("upload-row").all()) await expect(row).toHaveAttribute("data-phase", /ready|processing/);

  // Every thumbnail is upright: 1200 × 900 landscape pictures give 320 × 240 thumbnails whatever
  // the Exif orientation (3, 6, 8 included), and the quadrant colours sit where they belong.
  for (const [i, o] of orientations.entries()) {
    const image = page.getByAltText(new RegExp(`bench-${i + 1}-exif${o}\\.jpg$`));
    await expect(image).toBeVisible();
    await expect
      .poll(() => image.evaluate((img: HTMLImageElement) => (img.complete && img.naturalWidth > 0 ? [img.naturalWidth, img.naturalHeight] : null)), {
        message: `thumbnail of bench-${i + 1} (Exif ${o})`,
      })
      .toEqual([320, 240]);
    if (o === 1) continue;
    const res = await page.request.get((await image.getAttribute("src"))!);
    expect(res.headers()["content-type"]).toBe("image/webp");
    const { data, info } = await sharp(await res.body())
      .raw()
      .toBuffer({ resolveWithObject: true });
    const pixel = (x: number, y: number) => [...data.subarray((y * info.width + x) * info.channels, (y * info.width + x) * info.channels + 3)];
    // CIPA DC-008 (Exif 2.3): orientation 3 is shown turned 180°, 6 turned 90° clockwise and 8 turned
    // 90° counter-clockwise; after that, the picture's own top-left quadrant is at the top left. (a)
    expect(
      [pixel(20, 20), pixel(info.width - 20, 20), pixel(20, info.height - 20), pixel(info.width - 20, info.height - 20)].map(nearestQuadrant),
      `quadrants of the thumbnail of bench-${i + 1} (Exif ${o})`,
    ).toEqual(["topLeft", "topRight", "bottomLeft", "bottomRight"]);
  }

  await page.screenshot({ path: testInfo.outputPath("photos-desktop.png"), fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: testInfo.outputPath("photos-phone.png"), fullPage: true });
});

test("a file the store never received can be retried, an upload can be cancelled, and a refused file says why", async ({ page }) => {
  const unitId = await createPhotoBenchUnit();
  await signInAs(page, "inspector@vellmoor.example");
  await page.goto(`/units/${unitId}`);

  // The object store unreachable for the PUT (connection refused), then back.
  await page.route("**/uploads/**", (route) => route.abort("connectionrefused"));
  await chooseFiles(page, [file("outage.jpg", await orientedPhoto(20, 1))]);
  await page.getByRole("button", { name: "Upload 1 photo" }).click();
  const row = page.getByTestId("upload-row").filter({ hasText: "outage.jpg" });
  await expect(row.getByTestId("upload-status")).toHaveText(/photo store is not reachable/);
  await page.unroute("**/uploads/**");
  await row.getByRole("button", { name: "Retry" }).click();
  await expect(page.locator('[data-testid="photo-card"][data-status="ready"]')).toHaveCount(1, { timeout: 30_000 });

  // A PUT that hangs is cancelled by the inspector.
  let release: () => void = () => {};
  const released = new Promise<void>((resolve) => (release = resolve));
  await page.route("**/uploads/**", async (route) => {
    await released;
    await route.abort().catch(() => {});
  });
  await chooseFiles(page, [file("cancel-me.jpg", await orientedPhoto(21, 1))]);
  await page.getByRole("button", { name: "Upload 1 photo" }).click();
  const hanging = page.getByTestId("upload-row").filter({ hasText: "cancel-me.jpg" });
  await expect(hanging).toHaveAttribute("data-phase", "uploading");
  await hanging.getByRole("button", { name: "Cancel" }).click();
  await expect(hanging).toHaveAttribute("data-phase", "cancelled");
  release();
  await page.unroute("**/uploads/**");

  // Not a photo: the server's reason is shown and there is nothing to retry.
  await chooseFiles(page, [file("notes.jpg", Buffer.from("serial,grade\nA1,B\n"))]);
  await page.getByRole("button", { name: "Upload 1 photo" }).click();
  const refused = page.getByTestId("upload-row").filter({ hasText: "notes.jpg" });
  await expect(refused.getByTestId("upload-status")).toHaveText(/text file, not an image/);
  await expect(refused.getByRole("button", { name: "Retry" })).toHaveCount(0);
  await expect(page.getByTestId("photo-card")).toHaveCount(1);
});

test("photos can be dropped onto the page; auditors cannot open the Bench (blind recheck)", async ({ page, browser }) => {
  const unitId = await createPhotoBenchUnit();
  await signInAs(page, "inspector@vellmoor.example");
  await page.goto(`/units/${unitId}`);
  const bytes = (await orientedPhoto(30, 1)).toString("base64");
  const transfer = await page.evaluateHandle((b64) => {
    const data = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0));
    const dt = new DataTransfer();
    dt.items.add(new File([data], "dropped.jpg", { type: "image/jpeg" }));
    return dt;
  }, bytes);
  await expect(page.getByTestId("photo-file-input")).toBeEnabled(); // hydrated: the drop zone has its handlers
  await page.getByTestId("photo-drop-zone").dispatchEvent("drop", { dataTransfer: transfer });
  await expect(page.getByTestId("upload-row")).toHaveCount(1);
  await page.getByRole("button", { name: "Upload 1 photo" }).click();
  await expect(page.locator('[data-testid="photo-card"][data-status="ready"]')).toHaveCount(1, { timeout: 30_000 });

  const auditorContext = await browser.newContext();
  try {
    const auditor = await auditorContext.newPage();
    await signInAs(auditor, "auditor@vellmoor.example");
    await auditor.goto(`/units/${unitId}`);
    await expect(auditor.getByTestId("forbidden")).toBeVisible();
    await expect(auditor.getByTestId("photo-card")).toHaveCount(0);
    await expect(auditor.getByTestId("photo-uploader")).toHaveCount(0);
  } finally {
    await auditorContext.close();
  }
});
