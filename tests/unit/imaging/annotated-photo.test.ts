/**
 * Annotated photos: regions land where they belong (upright original pixels, scaled to the
 * output), in the Bench's class styles, with a legend below. Pixels are read back with sharp.
 * Exif orientation 6 = rotate 90° clockwise to view (CIPA DC-008 via libjpeg-turbo's
 * jpegexiforient notes, a — see the project's references).
 */
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { defectStyleMap } from "@/lib/annotate/class-looks";
import { SURFACE_STYLE, UNKNOWN_DEFECT_STYLE } from "@/lib/annotate/defect-styles";
import { annotationOverlay, renderAnnotatedPhoto } from "@/lib/imaging/annotated-photo";

const classes = [
  { key: "scratch", label: "Scratch" },
  { key: "dent", label: "Dent" },
  { key: "crack", label: "Crack" },
];
const grey = { r: 128, g: 128, b: 128 };

async function greyPhoto(width: number, height: number, orientation?: number): Promise<Buffer> {
  const image = sharp({ create: { width, height, channels: 3, background: grey } });
  return (orientation ? image.withMetadata({ orientation }) : image).jpeg({ quality: 95 }).toBuffer();
}

async function pixel(jpeg: Buffer, x: number, y: number) {
  const { data, info } = await sharp(jpeg).raw().toBuffer({ resolveWithObject: true });
  const at = (y * info.width + x) * info.channels;
  return { r: data[at], g: data[at + 1], b: data[at + 2] };
}

const near = (a: { r: number; g: number; b: number }, b: { r: number; g: number; b: number }, tolerance = 24) =>
  Math.abs(a.r - b.r) <= tolerance && Math.abs(a.g - b.g) <= tolerance && Math.abs(a.b - b.b) <= tolerance;
const hex = (colour: string) => ({ r: parseInt(colour.slice(1, 3), 16), g: parseInt(colour.slice(3, 5), 16), b: parseInt(colour.slice(5, 7), 16) });

// Rendering and reading PDFs/images back is CPU-bound; the machine may be shared.
describe("renderAnnotatedPhoto", { timeout: 30_000 }, () => {
  it("draws a region's outline in its class colour where the region is, and leaves the rest of the photo alone", async () => {
    const dentColour = defectStyleMap(classes.map((c) => c.key)).get("dent")!.colour;
    const out = await renderAnnotatedPhoto({
      image: await greyPhoto(400, 300),
      regions: [{ defect: "dent", shape: { kind: "rect", x: 100, y: 100, width: 120, height: 80 } }],
      classes,
      legend: false,
    });
    expect([out.width, out.height]).toEqual([400, 300]);
    // Walk the rectangle's outline: dashes leave gaps (halo shows there), but a good part is the class colour.
    const { data, info } = await sharp(out.jpeg).raw().toBuffer({ resolveWithObject: true });
    const at = (x: number, y: number) => ({ r: data[(y * info.width + x) * 3], g: data[(y * info.width + x) * 3 + 1], b: data[(y * info.width + x) * 3 + 2] });
    const outline: [number, number][] = [];
    for (let x = 100; x < 220; x++) outline.push([x, 100], [x, 180]);
    for (let y = 100; y < 180; y++) outline.push([100, y], [220, y]);
    // JPEG's halved colour resolution shifts thin lines' colours, so "class colour" means nearer to it than to the photo or the halo.
    const distance = (a: { r: number; g: number; b: number }, b: { r: number; g: number; b: number }) => Math.hypot(a.r - b.r, a.g - b.g, a.b - b.b);
    const black = { r: 0, g: 0, b: 0 };
    const isClassColour = (p: { r: number; g: number; b: number }) => distance(p, hex(dentColour)) < Math.min(distance(p, grey), distance(p, black));
    const coloured = outline.filter(([x, y]) => isClassColour(at(x, y))).length;
    expect(coloured / outline.length).toBeGreaterThan(0.3);
    // Away from the outline the class colour does not appear.
    expect(isClassColour(at(160, 60))).toBe(false);
    expect(near(await pixel(out.jpeg, 20, 20), grey, 6)).toBe(true);
    expect(near(await pixel(out.jpeg, 350, 260), grey, 6)).toBe(true);
  });

  it("turns the photo upright (Exif orientation 6) and places regions in upright coordinates", async () => {
    // Stored 400 × 200, viewed 200 × 400.
    const style = defectStyleMap(classes.map((c) => c.key)).get("scratch")!;
    const out = await renderAnnotatedPhoto({ image: await greyPhoto(400, 200, 6), regions: [{ defect: "scratch", shape: { kind: "spot", x: 100, y: 300, radius: 30 } }], classes, legend: false });
    expect([out.width, out.height]).toEqual([200, 400]);
    expect(near(await pixel(out.jpeg, 100, 300), grey, 6)).toBe(false);
    expect(near(await pixel(out.jpeg, 100, 100), grey, 6)).toBe(true);
    expect(style.tintOpacity).toBeGreaterThan(0);
  });

  it("scales regions from the original's pixels when given a smaller preview, and fits maxEdge", async () => {
    const out = await renderAnnotatedPhoto({
      image: await greyPhoto(800, 600),
      regionSpace: { width: 1600, height: 1200 },
      regions: [{ defect: "crack", shape: { kind: "spot", x: 1200, y: 300, radius: 60 } }],
      classes,
      legend: false,
      maxEdge: 400,
    });
    expect([out.width, out.height]).toEqual([400, 300]);
    // 1200,300 in the original is 300,75 in a 400-px-wide output.
    expect(near(await pixel(out.jpeg, 300, 75), grey, 6)).toBe(false);
    expect(near(await pixel(out.jpeg, 100, 225), grey, 6)).toBe(true);
  });

  it("adds a white legend band below the photo", async () => {
    const out = await renderAnnotatedPhoto({
      image: await greyPhoto(400, 300),
      regions: [{ defect: "dent", shape: { kind: "rect", x: 10, y: 10, width: 20, height: 20 } }],
      classes,
      caption: "Unit OV-1 · Front · grade C",
    });
    expect(out.photoHeight).toBe(300);
    expect(out.height).toBeGreaterThan(320);
    expect(near(await pixel(out.jpeg, 395, out.height - 3), { r: 255, g: 255, b: 255 }, 6)).toBe(true);
  });
});

describe("annotationOverlay", () => {
  const input = {
    image: Buffer.alloc(0),
    regions: [
      {
        defect: "scratch",
        shape: {
          kind: "line" as const,
          points: [
            [10, 10],
            [90, 40],
          ] as [number, number][],
          width: 3,
        },
      },
      {
        defect: "scratch",
        shape: {
          kind: "line" as const,
          points: [
            [20, 60],
            [90, 90],
          ] as [number, number][],
          width: 2,
        },
      },
      {
        defect: "crack",
        shape: {
          kind: "polygon" as const,
          points: [
            [50, 50],
            [80, 50],
            [70, 80],
          ] as [number, number][],
        },
      },
      { defect: "swelling", shape: { kind: "rect" as const, x: 1, y: 1, width: 5, height: 5 } },
    ],
    surface: [{ kind: "rect" as const, x: 0, y: 0, width: 100, height: 100 }],
    classes,
  };

  it("lists the classes present with their counts, an unlisted class by its key, and the Surface", () => {
    const { legend } = annotationOverlay(input, { width: 100, height: 100 }, { width: 100, height: 100 });
    expect(legend.map((e) => [e.label, e.count])).toEqual([
      ["Scratch", 2],
      ["Crack", 1],
      ["swelling (class not listed)", 1],
      ["Surface (part outline)", undefined],
    ]);
    expect(legend[2].style).toBe(UNKNOWN_DEFECT_STYLE);
    expect(legend[3].style).toBe(SURFACE_STYLE);
  });

  it("draws each class with its own dash pattern and fill (told apart without colour)", () => {
    const styles = defectStyleMap(classes.map((c) => c.key));
    const { svg } = annotationOverlay(input, { width: 100, height: 100 }, { width: 100, height: 100 });
    const crack = styles.get("crack")!;
    const scratch = styles.get("scratch")!;
    expect(crack.fill).not.toBe(scratch.fill);
    if (crack.fill !== "tint" && crack.fill !== "none") expect(svg).toContain(`<pattern id="f-${crack.fill}-`);
    if (crack.stroke.dash.length) expect(svg).toContain(`stroke-dasharray="${crack.stroke.dash.join(" ")}"`);
    // The SVG parses as an image (librsvg through sharp).
    return expect(sharp(Buffer.from(svg)).png().toBuffer()).resolves.toBeInstanceOf(Buffer);
  });
});
