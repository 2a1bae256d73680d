/**
 * annotateReportPhotos (the lot report's and evidence pack's photos): the rows' order whatever
 * finishes first, at most `concurrency` photos fetched and drawn at once, a photo whose stored
 * object is gone (or has no preview yet) left out, captions from the unit and view, and the
 * regions drawn at the report size from the preview (region coordinates in the original's space).
 */
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { ANNOTATED_EDGE } from "@/lib/imaging/annotated-photo";
import { annotateReportPhotos, type ReportPhotoRow } from "@/lib/reports/lot-report-photos";
import { REPORT_CLASSES } from "@/support/fixtures/report-data";

const grey = (width: number, height: number) =>
  sharp({ create: { width, height, channels: 3, background: { r: 128, g: 128, b: 128 } } })
    .webp()
    .toBuffer();

const row = (n: number, previewKey: string | null): ReportPhotoRow => ({
  unitId: `u${n}`,
  viewKey: "front",
  previewKey,
  // The original was 4000 × 3000; the stored preview is smaller (same picture).
  width: 4000,
  height: 3000,
  regions: [
    { role: "defect", defect: "dent", shape: { kind: "rect", x: 1000, y: 1000, width: 2000, height: 1000 } },
    { role: "surface", defect: null, shape: { kind: "rect", x: 100, y: 100, width: 3800, height: 2800 } },
  ],
});

const units = new Map([0, 1, 2, 3].map((n) => [`u${n}`, { serial: `SN-${n}`, sampleIndex: n + 1, grade: n === 2 ? null : "C" }]));
const views = [{ key: "front", label: "Front" }];

describe("annotateReportPhotos", { timeout: 30_000 }, () => {
  it("keeps the rows' order, leaves out what cannot be read, and draws at the report size", async () => {
    const preview = await grey(2560, 1920);
    const objects = new Map([
      ["p0", preview],
      ["p1", preview],
      ["p3", preview],
    ]);
    let inFlight = 0;
    let most = 0;
    const delays: Record<string, number> = { p0: 60, p1: 5, p2: 1, p3: 1 };
    const photos = await annotateReportPhotos([row(0, "p0"), row(1, "p1"), row(2, "p2"), row(3, "p3"), { ...row(3, null) }], {
      read: async (key) => {
        most = Math.max(most, ++inFlight);
        await new Promise((resolve) => setTimeout(resolve, delays[key]));
        inFlight--;
        return objects.get(key) ?? null; // p2's object is gone
      },
      units,
      classes: REPORT_CLASSES,
      views,
      concurrency: 2,
    });
    expect(photos.map((p) => p.caption)).toEqual(["Unit SN-0 · Front · grade C", "Unit SN-1 · Front · grade C", "Unit SN-3 · Front · grade C"]);
    expect(most).toBe(2);
    for (const photo of photos) {
      const meta = await sharp(photo.jpeg).metadata();
      expect(meta.format).toBe("jpeg");
      expect(meta.width).toBe(ANNOTATED_EDGE.report);
      expect(meta.height).toBe(photo.height);
      expect(photo.height).toBeGreaterThan(750); // 1000 × 750 photo plus the legend band
    }
    // The dent (x 1000–3000, y 1000–2000 of 4000 × 3000) lands at x 250–750, y 250–500 of the
    // 1000 px output: its tint changes the grey inside, the grey stays outside the Surface.
    const { data, info } = await sharp(photos[0].jpeg).raw().toBuffer({ resolveWithObject: true });
    const px = (x: number, y: number) => Array.from(data.subarray((y * info.width + x) * info.channels, (y * info.width + x) * info.channels + 3));
    const differs = (p: number[]) => p.some((c) => Math.abs(c - 128) > 12);
    expect(differs(px(500, 380))).toBe(true);
    expect(differs(px(10, 10))).toBe(false);
  });

  it("fails the whole set when a photo cannot be decoded (no report with a photo silently missing)", async () => {
    await expect(annotateReportPhotos([row(0, "bad")], { read: async () => Buffer.from("not an image"), units, classes: REPORT_CLASSES, views, concurrency: 2 })).rejects.toThrow();
  });
});
