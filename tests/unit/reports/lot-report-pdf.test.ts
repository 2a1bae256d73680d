/**
 * The lot inspection report read back with pdf.js (tests/support/pdf-text.ts) and checked against
 * the data it was made from: every sampled unit's serial, the plan's Ac/Re per severity, the
 * verdict, disposition and reason, accented names, the Pareto table's numbers, page numbers.
 */
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { renderAnnotatedPhoto } from "@/lib/imaging/annotated-photo";
import { paretoRows } from "@/lib/reports/pareto";
import { renderLotReportPdf } from "@/lib/reports/lot-report-pdf";
import { flatText, pdfText } from "@/tests/support/pdf-text";
import { lotReportFixture, PEOPLE, REPORT_CLASSES, SUPPLIER } from "@/support/fixtures/report-data";

async function photo(i: number) {
  const image = await sharp({ create: { width: 640, height: 480, channels: 3, background: { r: 90 + i, g: 110, b: 120 } } })
    .jpeg()
    .toBuffer();
  const annotated = await renderAnnotatedPhoto({
    image,
    regions: [
      {
        defect: "crack",
        shape: {
          kind: "polygon",
          points: [
            [100, 100],
            [300, 120],
            [200, 300],
          ],
        },
      },
    ],
    classes: REPORT_CLASSES,
    caption: `Unit ${i} · Front`,
    maxEdge: 640,
  });
  return { caption: `Unit OV-CAM-24-${String(1000 + i).padStart(6, "0")} · Front`, jpeg: annotated.jpeg, width: annotated.width, height: annotated.height };
}

// Rendering and reading PDFs/images back is CPU-bound; the machine may be shared.
describe("renderLotReportPdf", { timeout: 30_000 }, () => {
  it("states the lot, the plan per severity, the verdict and the lead's reason, with accents intact", async () => {
    const data = lotReportFixture({ units: 20, defective: 4 });
    const text = flatText(await pdfText(await renderLotReportPdf(data)));
    for (const expected of [
      "Lot inspection report",
      data.lot.purchaseRef,
      SUPPLIER,
      "Rear camera module",
      "Korvo X2",
      "1200 units, received 2026-11-24",
      "tightened inspection",
      "Rejected",
      "Return to vendor",
      data.decision!.reason!,
      `2026-12-01 09:55 UTC by ${PEOPLE.lead}`,
      "Grades are decision aids",
    ]) {
      expect(text).toContain(expected);
    }
    // Ac/Re per severity, with the arrow when the plan letter differs from the code letter.
    expect(text).toMatch(/Critical 0 \(none accepted\) J 20 0 1 20 0 Accept \(0 ≤ Ac 0\)/);
    expect(text).toMatch(/Major 1 J 20 1 2 20 2 Reject \(2 ≥ Re 2\)/);
    expect(text).toMatch(/Minor 2\.5 J → K 20 3 4 20 4 Reject \(4 ≥ Re 4\)/);
  });

  it("lists every sampled unit with its serial, grade, classes and failures", async () => {
    const data = lotReportFixture({ units: 60, defective: 10 });
    const text = flatText(await pdfText(await renderLotReportPdf(data)));
    for (const unit of data.units) {
      const serial = unit.serial ?? "(not recorded)";
      expect(text).toContain(`${unit.sampleIndex} ${serial} ${unit.grade}`);
    }
    expect(text).toContain("Autofocus (tele): hunts, no lock");
  });

  it("prints the Pareto table's numbers from the same rows as the chart", async () => {
    const data = lotReportFixture({ units: 20, defective: 4 });
    const text = flatText(await pdfText(await renderLotReportPdf(data)));
    for (const row of paretoRows(data.defectCounts)) {
      expect(text).toContain(`${row.label} ${row.count} ${(row.share * 100).toFixed(1)} % ${(row.cumulativeShare * 100).toFixed(1)} %`);
    }
  });

  it("runs onto several pages for 200 units and 40 photos, numbered n of N on each", async () => {
    const photos = await Promise.all(Array.from({ length: 40 }, (_, i) => photo(i)));
    const data = lotReportFixture({ units: 200, defective: 40, photos });
    const pages = await pdfText(await renderLotReportPdf(data));
    expect(pages.length).toBeGreaterThanOrEqual(25);
    pages.forEach((page, i) => expect(page.replace(/\s+/g, " ")).toContain(`Page ${i + 1} of ${pages.length}`));
    const text = flatText(pages);
    for (const p of photos) expect(text).toContain(p.caption);
    expect(text).toContain("Annotated photos of defective units");
  });

  it("says so when no defect was marked, and shows an open lot as not decided", async () => {
    const data = { ...lotReportFixture({ units: 5, defective: 0 }), defectCounts: [], decision: null, runningVerdict: "pending" as const };
    const text = flatText(await pdfText(await renderLotReportPdf(data)));
    expect(text).toContain("No cosmetic defects were marked");
    expect(text).toContain("Not decided yet (running verdict: pending)");
  });
});
