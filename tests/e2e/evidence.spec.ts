/**
 * Issue 17's done-when path in Chromium against the production build: a lead rejects a lot (its
 * sample inspected through the API as the Bench would, one unit's photo through the real upload
 * pipeline), prepares and previews the evidence on the lot page, sends it; the worker delivers it
 * and the message in the local inbox (read with mailparser) carries the lot report PDF, the
 * annotated photo and the CSV; the claim shows on the supplier page, where the scorecard's Pareto
 * chart renders beside its table and the claim's status moves. (Certificates: certificates.spec.ts.)
 * Lot 10 at level II → code B, n 3; AQL major 4.0 → Ac 0 Re 1 (ISO 2859-1 Table 2-A, as lot-cosmetic.spec.ts).
 */
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import sharp from "sharp";
import { parsedMessagesTo } from "../support/inbox-parsed";
import { testDb } from "./db";
import { signInAs } from "./support";

test.describe.configure({ timeout: 240_000 });

const stamp = `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`;
const contact = `claims-${stamp}@e2e-supplier.example`;

async function ok<T = unknown>(res: Awaited<ReturnType<APIRequestContext["post"]>>): Promise<T> {
  expect(res.ok(), await res.text()).toBe(true);
  return (await res.json()) as T;
}

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

/** A grey housing on a dark bench, 600 × 400 px: enough for the upload pipeline and a visible annotation. */
const benchPhoto = () =>
  sharp({ create: { width: 600, height: 400, channels: 3, background: "#30343a" } })
    .composite([{ input: { create: { width: 400, height: 200, channels: 3, background: "#9aa1a9" } }, left: 100, top: 100 }])
    .jpeg({ quality: 90 })
    .toBuffer();

/** Noise, 1500 × 1000 px: JPEG cannot squeeze it, so three such photos pass the test server's 1 MB e-mail limit. */
async function noisyPhoto(): Promise<Buffer> {
  const raw = Buffer.alloc(1500 * 1000 * 3);
  for (let i = 0; i < raw.length; i++) raw[i] = Math.imul(i, 2654435761) >>> 24;
  return sharp(raw, { raw: { width: 1500, height: 1000, channels: 3 } })
    .jpeg({ quality: 90 })
    .toBuffer();
}

/** Upload intent → PUT to the presigned URL → finalise, as the Bench's uploader does; waits until processed. */
async function uploadPhoto(request: APIRequestContext, unitId: string, noisy: boolean): Promise<string> {
  const bytes = noisy ? await noisyPhoto() : await benchPhoto();
  const intent = await ok<{ photoId: string; ticket: string; upload: { url: string; headers: Record<string, string> } }>(
    await request.post(`/api/units/${unitId}/photos/uploads`, { data: { viewKey: "back", fileName: "back.jpg", contentType: "image/jpeg", bytes: bytes.length } }),
  );
  const put = await fetch(intent.upload.url, { method: "PUT", headers: intent.upload.headers, body: new Uint8Array(bytes) });
  expect(put.status).toBe(200);
  await ok(await request.post(`/api/units/${unitId}/photos`, { data: { ticket: intent.ticket } }));
  await expect.poll(async () => (await ok<{ photo: { status: string } }>(await request.get(`/api/photos/${intent.photoId}`))).photo.status, { timeout: 60_000 }).toBe("ready");
  return intent.photoId;
}

/** Serial, checklist, a photo with its Surface and regions, measure, grade — as on the Bench. */
async function inspect(request: APIRequestContext, unitId: string, serial: string, { power, scratch, noisy = false }: { power: boolean; scratch: boolean; noisy?: boolean }) {
  await ok(await request.patch(`/api/units/${unitId}`, { data: { serial } }));
  await ok(await request.post(`/api/units/${unitId}/checklist`, { data: { itemId: "power", value: { pass: power } } }));
  const photoId = await uploadPhoto(request, unitId, noisy);
  const surface = {
    id: "surface",
    shape: {
      kind: "polygon",
      points: [
        [100, 100],
        [500, 100],
        [500, 300],
        [100, 300],
      ],
    },
  };
  const regions = scratch
    ? [
        {
          id: "scratch",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [140, 150],
              [420, 240],
            ],
            width: 8,
          },
        },
      ]
    : [];
  await ok(await request.put(`/api/photos/${photoId}/regions`, { data: { baseVersion: 0, regions: { surfaces: [surface], regions, ruler: null } } }));
  const { measurement } = await ok<{ measurement: { id: string } }>(await request.post(`/api/units/${unitId}/measure`));
  await ok(await request.post(`/api/units/${unitId}/grades`, { data: { decision: "accept", measurementId: measurement.id } }));
}

/**
 * A housing part type with a published rubric (scratch over 1 % of the Surface → C), a supplier
 * whose contact is `contact`, and a lot of 10 whose 3 sampled units are inspected: the first fails
 * its power check and is scratched (photos `noisy` on every unit when asked), the others are clean.
 */
async function inspectedLot(request: APIRequestContext, { tag, contact, noisy = false }: { tag: string; contact: string; noisy?: boolean }) {
  const { partType } = await ok<{ partType: { id: string } }>(
    await request.post("/api/part-types", {
      data: {
        name: `Evidence housing ${tag}`,
        category: "housing",
        views: [{ key: "back", label: "Back", required: true, zones: [] }],
        defectClasses: [{ key: "scratch", label: "Scratch", severity: "major" }],
        checklist: [{ id: "power", label: "Powers on", kind: "pass_fail", severityOnFail: "major" }],
        nominalSizeMm: { width: 60, height: 30 },
      },
    }),
  );
  await testDb().query(
    `INSERT INTO rubric_versions (workspace_id, part_type_id, version, status, rubric, created_by, published_by, published_at)
     SELECT u.workspace_id, $1, 1, 'published', $2, u.id, u.id, now() FROM users u WHERE u.email = 'lead@vellmoor.example'`,
    [partType.id, JSON.stringify({ rules: [{ id: "scratch-c", metric: "share", defect: "scratch", comparison: ">", threshold: 1, grade: "C" }] })],
  );
  const supplierName = `Harrowgate Spares ${tag}`;
  const { supplier } = await ok<{ supplier: { id: string } }>(await request.post("/api/suppliers", { data: { name: supplierName, contactEmail: contact } }));
  const purchaseRef = `PO-EVI-${tag}`;
  const { lot } = await ok<{ lot: { id: string } }>(
    await request.post("/api/lots", {
      data: {
        supplierId: supplier.id,
        partTypeId: partType.id,
        purchaseRef,
        quantity: 10,
        receivedOn: "2026-11-24",
        dueOn: "2026-12-01",
        inspectionLevel: "II",
        aqlCritical: null,
        aqlMajor: 4.0,
        aqlMinor: 4.0,
      },
    }),
  );
  await ok(await request.post(`/api/lots/${lot.id}/units`, { data: { source: "placeholders" } }));
  const { units } = await ok<{ units: { id: string }[] }>(await request.get(`/api/lots/${lot.id}/units`));
  expect(units).toHaveLength(3);
  const serials = units.map((_, i) => `EVI-${tag}-${i + 1}`);
  await inspect(request, units[0].id, serials[0], { power: false, scratch: true, noisy });
  await inspect(request, units[1].id, serials[1], { power: true, scratch: noisy, noisy });
  await inspect(request, units[2].id, serials[2], { power: true, scratch: noisy, noisy });
  return { supplier, lot, purchaseRef, serials };
}

test("a lead rejects a lot, previews and sends the evidence; the inbox has the files; the claim and the Pareto chart show on the supplier page", async ({ page }) => {
  await signInAs(page, "lead@vellmoor.example");
  const request = page.request;

  const { supplier, lot, purchaseRef, serials } = await inspectedLot(request, { tag: stamp, contact });

  // The lead rejects it on the lot page: a major defective against Re 1.
  await page.goto(`/lots/${lot.id}`);
  await expect(page.getByTestId("lot-verdict")).toHaveText("Reject");
  const form = page.getByTestId("disposition-form");
  await form.getByLabel("Return to vendor").check();
  await form.getByLabel("Reason").fill("Unit does not power on and its housing is deeply scratched.");
  await form.getByRole("button", { name: "Record disposition" }).click();
  await expect(page.getByTestId("disposition")).toContainText("Return to vendor");

  // Prepare and preview the evidence from the editable template.
  const panel = page.getByTestId("evidence-panel");
  await expect(panel.getByLabel("Subject")).toHaveValue(/\{\{lot\}\}/);
  await panel.getByLabel(/Claim \/ RMA reference/).fill(`RMA-${stamp}`);
  await panel.getByRole("button", { name: "Preview" }).click();
  const preview = panel.getByTestId("evidence-preview");
  await expect(preview).toContainText(`To: ${contact}`);
  await expect(preview).toContainText(`Lot ${purchaseRef}`);
  await expect(preview).toContainText(`RMA-${stamp}`);
  await expect(preview).toContainText(`lot-report-${purchaseRef}.pdf`);
  await expect(preview).toContainText(`sampled-units-${purchaseRef}.csv`);
  await expect(preview).toContainText(/photo-01-Unit_EVI-.*_Back_grade_C\.jpg/);
  await preview.scrollIntoViewIfNeeded();
  await shoot(page, "evidence-preview");

  // Send: the worker delivers it; the pack's line follows its state.
  await preview.getByRole("button", { name: `Send to ${contact}` }).click();
  const item = panel.getByTestId(`evidence-RMA-${stamp}`);
  await expect(item.getByTestId("evidence-delivery")).toHaveText(/E-mail sent/, { timeout: 60_000 });
  await item.scrollIntoViewIfNeeded();
  await shoot(page, "evidence-sent");

  await expect.poll(async () => (await parsedMessagesTo(contact)).length, { timeout: 30_000 }).toBe(1);
  const [message] = await parsedMessagesTo(contact);
  expect(message.subject).toContain(purchaseRef);
  const kinds = message.attachments.map((a) => a.contentType).sort();
  expect(kinds).toEqual(["application/pdf", "image/jpeg", "text/csv"]);
  for (const a of message.attachments) expect(a.size, a.filename).toBeGreaterThan(100);
  const photo = message.attachments.find((a) => a.contentType === "image/jpeg")!;
  expect((await sharp(photo.content).metadata()).width).toBeGreaterThan(500);
  const csv = message.attachments.find((a) => a.contentType === "text/csv")!.content.toString("utf8");
  for (const serial of serials) expect(csv).toContain(serial);

  // The supplier page: the claim, the open-claims table, and the Pareto chart beside its table.
  await page.goto(`/suppliers/${supplier.id}`);
  const scorecard = page.getByTestId("supplier-scorecard");
  await expect(scorecard.getByTestId("pareto-chart").locator(".recharts-bar-rectangle").first()).toBeVisible();
  // One class: the cumulative line is a single point (100 %), drawn as its dot.
  await expect(scorecard.getByTestId("pareto-chart").locator(".recharts-line-dots .recharts-dot").first()).toBeVisible();
  await expect(scorecard.getByTestId("scorecard-pareto")).toContainText("Scratch");
  await expect(scorecard.getByTestId("scorecard-open-claims")).toContainText(`RMA-${stamp}`);
  await expect(scorecard.getByTestId("scorecard-switching")).toContainText(`Evidence housing ${stamp}`);
  const claim = page.getByTestId("supplier-claims").getByTestId(`evidence-RMA-${stamp}`);
  await expect(claim).toContainText(purchaseRef);
  await shoot(page, "supplier-scorecard-claims");
  // The Reports screen's scorecards count the open claim and link to this page.
  await page.goto(`/reports?supplierId=${supplier.id}`);
  const row = page.getByTestId("report-scorecards").locator("tbody tr", { hasText: `Harrowgate Spares ${stamp}` });
  await expect(row.locator("td").last()).toHaveText("1");
  await expect(row.getByRole("link", { name: `Harrowgate Spares ${stamp}` })).toHaveAttribute("href", `/suppliers/${supplier.id}`);
  await page.goto(`/suppliers/${supplier.id}`);
  await claim.getByLabel("Claim status").selectOption("credited");
  await claim.getByLabel("Note").fill("Credit note for the lot received.");
  // Wait for the save's answer: the scorecard is drawn on the server when the page loads.
  const saved = page.waitForResponse((res) => res.url().includes("/api/claims/") && res.request().method() === "PATCH");
  await claim.getByRole("button", { name: "Save claim" }).click();
  expect((await saved).status()).toBe(200);
  await page.reload();
  await expect(page.getByTestId("supplier-claims").getByTestId(`evidence-RMA-${stamp}`).getByLabel("Claim status")).toHaveValue("credited");
  await expect(page.getByTestId("scorecard-open-claims")).not.toContainText(`RMA-${stamp}`);
});

test("evidence over the e-mail limit goes behind a link: the supplier opens it signed out; the lead withdraws it and the page says so", async ({ page, browser }) => {
  await signInAs(page, "lead@vellmoor.example");
  const tag = `${stamp}l`;
  const linkContact = `links-${tag}@e2e-supplier.example`;
  const { lot, purchaseRef } = await inspectedLot(page.request, { tag, contact: linkContact, noisy: true });
  await ok(await page.request.post(`/api/lots/${lot.id}/disposition`, { data: { disposition: "return_to_vendor", reason: "Scratched housings throughout the sample." } }));

  await page.goto(`/lots/${lot.id}`);
  const panel = page.getByTestId("evidence-panel");
  await panel.getByRole("button", { name: "Preview" }).click();
  await expect(panel.getByTestId("evidence-link-note")).toContainText("expiring evidence link");
  await panel
    .getByTestId("evidence-preview")
    .getByRole("button", { name: `Send to ${linkContact}` })
    .click();
  const state = panel.getByTestId("evidence-link-state");
  await expect(state).toContainText("Evidence link open until");
  await expect.poll(async () => (await parsedMessagesTo(linkContact)).length, { timeout: 60_000 }).toBe(1);
  const [message] = await parsedMessagesTo(linkContact);
  expect(message.attachments).toEqual([]);
  const url = message.text.match(/https?:\/\/\S+\/evidence\/\S+/)![0];

  // The supplier: no session at all.
  const supplierSide = await browser.newContext();
  const visitor = await supplierSide.newPage();
  await visitor.goto(new URL(url).pathname);
  await expect(visitor.getByTestId("evidence-link-ok")).toContainText(purchaseRef);
  await expect(visitor.getByRole("navigation")).toHaveCount(0);
  const pdfLink = visitor.getByRole("link", { name: `lot-report-${purchaseRef}.pdf` });
  const pdf = await visitor.request.get((await pdfLink.getAttribute("href"))!);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  await shoot(visitor, "evidence-link-page");

  await state.getByRole("button", { name: "Withdraw link" }).click();
  await expect(state).toContainText("Evidence link withdrawn");
  await visitor.reload();
  await expect(visitor.getByTestId("evidence-link-refused")).toHaveAttribute("data-reason", "revoked");
  await expect(visitor.getByText("This evidence link was withdrawn by the sender.")).toBeVisible();
  await shoot(visitor, "evidence-link-withdrawn");
  await supplierSide.close();
});
