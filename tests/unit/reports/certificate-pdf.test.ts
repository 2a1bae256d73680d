/**
 * The condition certificate read back with pdf.js and checked against its data: one page, the
 * part, grade and explanation, checklist summary, rubric version, issuer, short code and the
 * content hash (recomputed by certificate-content's own tests from a hand-written canonical form).
 */
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { certificateHash, groupedHash } from "@/lib/reports/certificate-content";
import { renderCertificatePdf } from "@/lib/reports/certificate-pdf";
import { flatText, pdfText } from "@/tests/support/pdf-text";
import { certificateFixture } from "@/support/fixtures/report-data";

const thumbnail = await sharp({ create: { width: 320, height: 240, channels: 3, background: { r: 120, g: 130, b: 140 } } })
  .jpeg()
  .toBuffer();

// Rendering and reading PDFs/images back is CPU-bound; the machine may be shared.
describe("renderCertificatePdf", { timeout: 30_000 }, () => {
  it("is one page stating the certificate's data and its content hash", async () => {
    const data = certificateFixture(thumbnail, { workspaceName: "Zoë Łukasiewicz Refurb (demo)" });
    const pages = await pdfText(await renderCertificatePdf(data));
    expect(pages).toHaveLength(1);
    const text = flatText(pages);
    for (const expected of [
      "Condition certificate",
      "Zoë Łukasiewicz Refurb (demo)",
      "Rear camera module",
      "Korvo X2",
      "OV-CAM-24-000113",
      "Camera cosmetic (example), version 3",
      "• Scratch: 1.8 % of the surface ≥ 1 % → B",
      "3 of 4 checks passed, 1 failed.",
      "✗ Optical stabilisation (drifts after 3 s)",
      "Issued 2026-12-01 10:30 UTC",
      data.shortCode,
      groupedHash(certificateHash(data)),
      "Grades are decision aids",
      "Front",
      "Lens",
    ]) {
      expect(text).toContain(expected);
    }
    expect(text).toMatch(/CO\s?SMETIC GRADE B/);
  });

  it("stays on one page with long data, saying how much is left out", async () => {
    const many = Array.from({ length: 30 }, (_, i) => `Rule ${i + 1}: a long explanation line that goes on and on about the measured scratch length in millimetres`);
    const data = certificateFixture(thumbnail, {
      explanation: many,
      checklist: Array.from({ length: 25 }, (_, i) => ({ label: `Check ${i + 1} with a rather long label`, result: i % 5 ? ("pass" as const) : ("fail" as const), detail: "reading out of range" })),
      views: Array.from({ length: 6 }, (_, i) => ({ label: `View ${i + 1}`, photoSha256: "ab".repeat(32), thumbnail })),
      grade: "Reject",
    });
    const pages = await pdfText(await renderCertificatePdf(data));
    expect(pages).toHaveLength(1);
    const text = flatText(pages);
    expect(text).toContain("… 25 more on the verification page");
    expect(text).toContain("… 2 more on the verification page");
    expect(text).toContain("Reject");
  });

  it("keeps the place and label of a view whose photo could not be read (an empty thumbnail)", async () => {
    const data = certificateFixture(thumbnail);
    const views = [{ ...data.views[0], label: "Lens side", thumbnail: Buffer.alloc(0) }, ...data.views.slice(1)];
    const pages = await pdfText(await renderCertificatePdf({ ...data, views }));
    expect(pages).toHaveLength(1);
    const text = flatText(pages);
    expect(text).toContain("Photo not available");
    expect(text).toContain("Lens side");
  });

  it("uses the workspace's time zone when given", async () => {
    const text = flatText(await pdfText(await renderCertificatePdf(certificateFixture(thumbnail), { timeZone: "Europe/Oslo" })));
    expect(text).toContain("Issued 2026-12-01 11:30 Europe/Oslo");
  });
});
