/**
 * The Content-Security-Policy in a real browser: the main screens work under it (their scripts,
 * styles, fonts, the Bench's konva canvas and blob: images, an upload to the object store's
 * presigned URL) and the browser reports no violation on any of them. A violation shows both as a
 * `securitypolicyviolation` event (recorded by an init script) and as a console error.
 */
import { expect, test, type Page } from "@playwright/test";
import { createBenchUnit, partPhoto, uploadThroughApi } from "./bench-fixtures";
import { signInAs } from "./support";

async function watchViolations(page: Page) {
  const problems: string[] = [];
  await page.addInitScript(() => {
    const w = window as unknown as { __csp: string[] };
    w.__csp = [];
    document.addEventListener("securitypolicyviolation", (e) => w.__csp.push(`${e.violatedDirective} blocked ${e.blockedURI || "inline"} (${e.sourceFile}:${e.lineNumber})`));
  });
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to|Permissions-Policy/i.test(m.text())) problems.push(m.text());
  });
  return async () => [...problems, ...(await page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []))];
}

test("sign-in, queue, lots and the Bench with its canvas and an upload run with no CSP violation", async ({ page }) => {
  test.setTimeout(90_000);
  const { unitId } = await createBenchUnit();
  const violations = await watchViolations(page);

  const signInPage = await page.goto("/sign-in");
  const csp = signInPage!.headers()["content-security-policy"];
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
  expect(csp).toContain("frame-ancestors 'none'");
  expect(signInPage!.headers()["x-content-type-options"]).toBe("nosniff");
  // Every script tag of the page carries this response's nonce.
  const nonce = csp.match(/'nonce-([^']+)'/)![1];
  const scriptNonces = await page.locator("script").evaluateAll((els) => els.map((el) => (el as HTMLScriptElement).nonce));
  expect(scriptNonces.length).toBeGreaterThan(0);
  expect(scriptNonces.every((n) => n === nonce)).toBe(true);
  expect(await violations()).toEqual([]);

  await signInAs(page, "inspector@vellmoor.example");
  for (const path of ["/queue", "/lots"]) {
    await page.goto(path);
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  }
  expect(await violations()).toEqual([]);

  // The Bench: a photo drawn on the konva canvas from a blob: preview, and a second photo
  // uploaded through the page's own uploader (a PUT to the store's presigned URL).
  await uploadThroughApi(page.request, unitId, await partPhoto(1600, 1200), "front");
  await page.goto(`/units/${unitId}`);
  const stage = page.getByTestId("annotation-stage");
  await expect(stage).toHaveAttribute("data-ready", "true", { timeout: 30_000 });
  await expect(stage.locator("canvas").first()).toBeVisible();
  await page.getByRole("button", { name: "Add photos" }).click();
  const picker = page.getByTestId("photo-file-input");
  await expect(picker).toBeEnabled();
  await picker.setInputFiles({ name: "back.jpg", mimeType: "image/jpeg", buffer: await partPhoto(800, 600) });
  await page.getByRole("button", { name: "Upload 1 photo" }).click();
  await expect(page.getByTestId("upload-row").first()).toHaveAttribute("data-phase", /ready|processing/, { timeout: 30_000 });
  expect(await violations()).toEqual([]);
});

test("the app cannot be framed by another page", async ({ page }) => {
  await page.goto("/sign-in");
  const blocked: string[] = [];
  page.on("console", (m) => blocked.push(m.text()));
  await page.setContent(`<iframe src="${new URL("/sign-in", page.url()).href}"></iframe>`);
  await expect.poll(() => blocked.some((t) => /frame-ancestors|Refused to frame/i.test(t))).toBe(true);
});
