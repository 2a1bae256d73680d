/**
 * Synthetic bench photos for the demo, drawn as SVG and rendered with sharp: one part of the
 * seeded part type on a plain backdrop, seen from one view, with defects planted where the demo
 * wants them (scratch, crack, stain, dust, dent, chip, corrosion, swelling, torn flex) and, for
 * displays, a test pattern with dead and stuck pixels. Every shape and colour is invented; no
 * photo comes from anywhere else. Deterministic for a given seed. `renderAnnotatedPartPhoto` also
 * returns the regions an inspector would mark for the planted defects (photo-defects.ts).
 */
import sharp from "sharp";
import type { Shape } from "@/lib/geometry/shape";
import { xorshift32 } from "@/lib/random";
import { plantDefect, type Box, type Drawn, type PlantedDefect, type PlantedRegion } from "./photo-defects";

export type { PlantedDefect, PlantedRegion } from "./photo-defects";

export type PartPhotoSpec = {
  /** Part type slug or category ("rear-camera", "battery", "display", …); unknown ones get a generic module. */
  kind: string;
  viewKey: string;
  defects: PlantedDefect[];
  seed: number;
  width?: number;
  height?: number;
};

/** The renders' generator: xorshift32, as the seed has always drawn with. */
const random = xorshift32;

const box = (W: number, H: number, wShare: number, aspect: number): Box => {
  const w = W * wShare;
  const h = Math.min(H * 0.8, w * aspect);
  return { x: (W - w) / 2, y: (H - h) / 2, w, h };
};

const rect = (b: Box, r: number, attrs: string) => `<rect x="${b.x}" y="${b.y}" width="${b.w}" height="${b.h}" rx="${r}" ${attrs}/>`;

function connector(x: number, y: number, w: number, h: number) {
  const pins = Array.from({ length: 10 }, (_, i) => `<rect x="${x + w * 0.08 + i * w * 0.085}" y="${y + h * 0.25}" width="${w * 0.04}" height="${h * 0.5}" fill="#c9a227"/>`).join("");
  return `<rect x="${x}" y="${y}" width="${w}" height="${h}" rx="4" fill="#2b2b2e"/>${pins}`;
}

function flexTail(x: number, y: number, w: number, len: number) {
  return `<rect x="${x}" y="${y}" width="${w}" height="${len}" rx="6" fill="#d98b1f" stroke="#a8650d" stroke-width="2"/>${connector(x - w * 0.2, y + len - w * 0.6, w * 1.4, w * 0.6)}`;
}

function drawCamera(W: number, H: number, view: string): Drawn {
  const b = box(W, H, view === "lens" ? 0.5 : 0.32, 0.8);
  const cx = b.x + b.w / 2;
  const cy = b.y + b.h * 0.45;
  const lens =
    view === "back"
      ? ""
      : `<circle cx="${cx}" cy="${cy}" r="${b.w * 0.3}" fill="#111" stroke="#777" stroke-width="${b.w * 0.03}"/><circle cx="${cx}" cy="${cy}" r="${b.w * 0.18}" fill="url(#glass)"/><circle cx="${cx - b.w * 0.07}" cy="${cy - b.w * 0.07}" r="${b.w * 0.04}" fill="#fff" opacity="0.5"/>`;
  const tail = view === "connector" || view === "back" ? flexTail(cx - b.w * 0.1, b.y + b.h, b.w * 0.2, H * 0.12) : "";
  return { svg: `${tail}${rect(b, b.w * 0.06, 'fill="#3d4147" stroke="#1d1f22" stroke-width="4"')}${lens}`, surface: b };
}

function drawBattery(W: number, H: number, view: string): Drawn {
  const b = box(W, H, 0.36, 1.45);
  const label =
    view === "front"
      ? `<rect x="${b.x + b.w * 0.12}" y="${b.y + b.h * 0.3}" width="${b.w * 0.76}" height="${b.h * 0.25}" fill="#e8e4da"/><text x="${b.x + b.w / 2}" y="${b.y + b.h * 0.45}" font-family="sans-serif" font-size="${b.w * 0.08}" text-anchor="middle" fill="#333">Li-ion 3.85 V</text>`
      : "";
  const tab = view === "connector" || view === "front" ? flexTail(b.x + b.w * 0.62, b.y - H * 0.09, b.w * 0.14, H * 0.09) : "";
  return { svg: `${rect(b, b.w * 0.05, 'fill="#23252a" stroke="#111" stroke-width="4"')}${label}${tab}`, surface: b };
}

function drawHousing(W: number, H: number, view: string): Drawn {
  const b = box(W, H, 0.34, 2.0);
  const bump =
    view === "back"
      ? ""
      : `<rect x="${b.x + b.w * 0.08}" y="${b.y + b.h * 0.04}" width="${b.w * 0.34}" height="${b.w * 0.34}" rx="${b.w * 0.06}" fill="#50535a"/><circle cx="${b.x + b.w * 0.25}" cy="${b.y + b.h * 0.04 + b.w * 0.17}" r="${b.w * 0.08}" fill="#111"/>`;
  return { svg: `${rect(b, b.w * 0.14, `fill="${view === "back" ? "#8d9299" : "#5f7d94"}" stroke="#2c3a45" stroke-width="5"`)}${bump}`, surface: b };
}

function testPattern(s: Box): string {
  const bars = ["#ffffff", "#ffff00", "#00ffff", "#00ff00", "#ff00ff", "#ff0000", "#0000ff", "#000000"];
  const w = s.w / bars.length;
  const top = bars.map((c, i) => `<rect x="${s.x + i * w}" y="${s.y}" width="${w + 0.5}" height="${s.h * 0.6}" fill="${c}"/>`).join("");
  const steps = Array.from({ length: 8 }, (_, i) => `<rect x="${s.x + i * w}" y="${s.y + s.h * 0.6}" width="${w + 0.5}" height="${s.h * 0.4}" fill="rgb(${i * 36},${i * 36},${i * 36})"/>`).join("");
  return top + steps;
}

function drawDisplay(W: number, H: number, view: string): Drawn {
  const b = box(W, H, 0.34, 2.05);
  const screen = { x: b.x + b.w * 0.05, y: b.y + b.h * 0.035, w: b.w * 0.9, h: b.h * 0.93 };
  if (view === "back") return { svg: `${rect(b, b.w * 0.12, 'fill="#9aa0a6" stroke="#55595e" stroke-width="5"')}${flexTail(b.x + b.w * 0.4, b.y + b.h * 0.55, b.w * 0.2, b.h * 0.5)}`, surface: b };
  if (view === "connector")
    return { svg: `${rect(b, b.w * 0.12, 'fill="#9aa0a6" stroke="#55595e" stroke-width="5"')}${flexTail(b.x + b.w * 0.4, b.y + b.h * 0.7, b.w * 0.2, b.h * 0.35)}`, surface: b };
  const fill =
    view === "screen-white"
      ? `<rect x="${screen.x}" y="${screen.y}" width="${screen.w}" height="${screen.h}" fill="#f7f7f5"/>`
      : view === "screen-black"
        ? `<rect x="${screen.x}" y="${screen.y}" width="${screen.w}" height="${screen.h}" fill="#050505"/>`
        : testPattern(screen);
  return { svg: `${rect(b, b.w * 0.12, 'fill="#0c0d0f" stroke="#333" stroke-width="5"')}${fill}`, surface: b, screen };
}

function drawFlex(W: number, H: number, view: string): Drawn {
  const b = { x: W * 0.18, y: H * 0.42, w: W * 0.64, h: H * 0.12 };
  const port =
    view === "back"
      ? ""
      : `<rect x="${b.x - b.h * 0.9}" y="${b.y - b.h * 0.2}" width="${b.h * 1.1}" height="${b.h * 1.4}" rx="10" fill="#b8bcc2" stroke="#666" stroke-width="3"/><rect x="${b.x - b.h * 0.65}" y="${b.y + b.h * 0.25}" width="${b.h * 0.6}" height="${b.h * 0.5}" rx="6" fill="#222"/>`;
  return {
    svg: `<rect x="${b.x}" y="${b.y}" width="${b.w}" height="${b.h}" rx="12" fill="#d98b1f" stroke="#a8650d" stroke-width="3"/>${port}${connector(b.x + b.w - b.h * 0.2, b.y - b.h * 0.1, b.h * 1.6, b.h * 1.2)}`,
    surface: b,
  };
}

function drawSpeaker(W: number, H: number, view: string): Drawn {
  const b = box(W, H, 0.4, 0.55);
  const holes =
    view === "front"
      ? Array.from({ length: 60 }, (_, i) => `<circle cx="${b.x + b.w * (0.1 + (i % 15) * 0.057)}" cy="${b.y + b.h * (0.3 + Math.floor(i / 15) * 0.13)}" r="${b.w * 0.012}" fill="#111"/>`).join("")
      : "";
  const pads =
    view !== "front"
      ? `<rect x="${b.x + b.w * 0.1}" y="${b.y + b.h * 0.7}" width="${b.w * 0.12}" height="${b.h * 0.15}" fill="#c9a227"/><rect x="${b.x + b.w * 0.78}" y="${b.y + b.h * 0.7}" width="${b.w * 0.12}" height="${b.h * 0.15}" fill="#c9a227"/>`
      : "";
  return { svg: `${rect(b, b.w * 0.06, 'fill="#2e3136" stroke="#15171a" stroke-width="4"')}${holes}${pads}`, surface: b };
}

function drawPart(kind: string, W: number, H: number, view: string): Drawn {
  if (kind.includes("camera")) return drawCamera(W, H, view);
  if (kind.includes("battery")) return drawBattery(W, H, view);
  if (kind.includes("housing")) return drawHousing(W, H, view);
  if (kind.includes("display") || kind.includes("screen")) return drawDisplay(W, H, view);
  if (kind.includes("flex") || kind.includes("cable")) return drawFlex(W, H, view);
  if (kind.includes("speaker")) return drawSpeaker(W, H, view);
  return drawCamera(W, H, view);
}

const noiseCache = new Map<string, Promise<Buffer>>();

/**
 * A grain layer like a camera sensor's, so the photos do not compress like flat drawings (made once
 * per size). Gaussian, mean 128, sigma 10, from our seeded generator (Box–Muller): libvips' own
 * noise is unseeded, which made every render differ and the tests that learn from them flaky.
 */
function sensorNoise(W: number, H: number): Promise<Buffer> {
  const key = `${W}x${H}`;
  if (!noiseCache.has(key)) {
    const next = random(W * 7919 + H);
    const raw = Buffer.alloc(W * H * 3);
    for (let i = 0; i < raw.length; i += 2) {
      const radius = Math.sqrt(-2 * Math.log(1 - next())) * 10;
      const angle = 2 * Math.PI * next();
      raw[i] = Math.max(0, Math.min(255, Math.round(128 + radius * Math.cos(angle))));
      if (i + 1 < raw.length) raw[i + 1] = Math.max(0, Math.min(255, Math.round(128 + radius * Math.sin(angle))));
    }
    noiseCache.set(
      key,
      sharp(raw, { raw: { width: W, height: H, channels: 3 } })
        .png({ compressionLevel: 1 })
        .toBuffer(),
    );
  }
  return noiseCache.get(key)!;
}

export type AnnotatedPartPhoto = {
  /** Upright sRGB JPEG, no metadata. */
  jpeg: Buffer;
  width: number;
  height: number;
  /** The part's outline as a Box (its rounded corners are a few pixels inside). */
  surface: Shape;
  /** What an inspector would mark for each planted defect (the truth for learned-suggestion tests). */
  regions: PlantedRegion[];
};

/** Renders the photo upright and returns it with the regions of every planted defect. */
export async function renderAnnotatedPartPhoto(spec: PartPhotoSpec): Promise<AnnotatedPartPhoto> {
  const W = spec.width ?? 1600;
  const H = spec.height ?? 1200;
  // Defect strokes and blur are drawn for a 1 600 px wide photo and scale with the width.
  const u = W / 1600;
  const next = random(spec.seed);
  const drawn = drawPart(spec.kind, W, H, spec.viewKey);
  const planted = spec.defects.map((d) => plantDefect(d, drawn, next, u));
  const shadow = `<rect x="${drawn.surface.x + 18}" y="${drawn.surface.y + 22}" width="${drawn.surface.w}" height="${drawn.surface.h}" rx="24" fill="#000" opacity="0.25" filter="url(#shadow)"/>`;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">
    <defs>
      <radialGradient id="backdrop" cx="45%" cy="40%" r="75%"><stop offset="0" stop-color="#dfe3e6"/><stop offset="1" stop-color="#a9b1b8"/></radialGradient>
      <radialGradient id="glass" cx="40%" cy="40%" r="60%"><stop offset="0" stop-color="#2d4a6b"/><stop offset="1" stop-color="#05070a"/></radialGradient>
      <radialGradient id="dent" cx="40%" cy="40%" r="60%"><stop offset="0" stop-color="#000" stop-opacity="0.45"/><stop offset="1" stop-color="#fff" stop-opacity="0"/></radialGradient>
      <radialGradient id="bulge" cx="45%" cy="45%" r="55%"><stop offset="0" stop-color="#fff" stop-opacity="0.28"/><stop offset="1" stop-color="#fff" stop-opacity="0"/></radialGradient>
      <filter id="soft"><feGaussianBlur stdDeviation="${6 * u}"/></filter>
      <filter id="shadow"><feGaussianBlur stdDeviation="14"/></filter>
    </defs>
    <rect width="${W}" height="${H}" fill="url(#backdrop)"/>${shadow}${drawn.svg}${planted.map((d) => d.svg).join("")}
  </svg>`;
  const noise = await sensorNoise(W, H);
  const jpeg = await sharp(Buffer.from(svg))
    .flatten({ background: "#c0c6cc" })
    .composite([{ input: noise, blend: "soft-light" }])
    .jpeg({ quality: 88 })
    .toBuffer();
  const { x, y, w, h } = drawn.surface;
  return { jpeg, width: W, height: H, surface: { kind: "rect", x, y, width: w, height: h }, regions: planted.flatMap((d) => d.regions) };
}

/** Renders the photo upright, as an sRGB JPEG with no metadata (the caller tags Exif as it likes). */
export async function renderPartPhoto(spec: PartPhotoSpec): Promise<Buffer> {
  return (await renderAnnotatedPartPhoto(spec)).jpeg;
}

/**
 * The same upright picture stored as a camera held another way would store it, tagged with the
 * Exif orientation that turns it upright again (CIPA DC-008: 6 = rotate 90° clockwise to display,
 * 8 = 90° counter-clockwise, 3 = 180°), plus a capture time.
 */
export async function asCameraJpeg(upright: Buffer, { orientation, capturedAt, offset }: { orientation: 1 | 3 | 6 | 8; capturedAt: Date; offset: string }): Promise<Buffer> {
  const storedRotation = { 1: 0, 3: 180, 6: 270, 8: 90 }[orientation];
  const pad = (n: number) => String(n).padStart(2, "0");
  const minutes = (offset.startsWith("-") ? -1 : 1) * (Number(offset.slice(1, 3)) * 60 + Number(offset.slice(4, 6)));
  const local = new Date(capturedAt.getTime() + minutes * 60_000);
  const exifTime = `${local.getUTCFullYear()}:${pad(local.getUTCMonth() + 1)}:${pad(local.getUTCDate())} ${pad(local.getUTCHours())}:${pad(local.getUTCMinutes())}:${pad(local.getUTCSeconds())}`;
  return sharp(upright)
    .rotate(storedRotation)
    .withMetadata({ orientation })
    .withExifMerge({ IFD2: { DateTimeOriginal: exifTime, OffsetTimeOriginal: offset } })
    .jpeg({ quality: 88 })
    .toBuffer();
}
