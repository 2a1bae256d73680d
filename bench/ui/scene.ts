/**
 * The UI benchmark's scene: a generated 4000 × 3000 photo (sharp, an invented part on a light
 * card) and 1 000 defect regions of the four kinds — boxes, outlines, lines and spots — spread
 * over the whole photo, the same on every run (seeded mulberry32 from support/prng.ts).
 * Sizes are in original pixels and stay inside the photo, as the save validation requires.
 */
import sharp from "sharp";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Point, Shape } from "@/lib/geometry/shape";
import { mulberry32 } from "../../support/prng";

export const PHOTO = { width: 4000, height: 3000 } as const;
export const REGION_COUNT = 1_000;
export const SCENE_SEED = 20_261_201;

export const UI_BENCH_DEFECTS = [
  { key: "scratch", label: "Scratch", severity: "major" },
  { key: "dent", label: "Dent", severity: "minor" },
  { key: "chip", label: "Chip", severity: "major" },
  { key: "dust", label: "Dust under glass", severity: "minor" },
] as const;

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/** A plain photo: a dark module with a round window on a light card, a soft gradient, JPEG q88. */
export async function benchPhoto(): Promise<Buffer> {
  const { width: w, height: h } = PHOTO;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}">
  <defs>
    <linearGradient id="card" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="#e4e1da"/><stop offset="1" stop-color="#c9c6bf"/></linearGradient>
    <radialGradient id="glass" cx="0.45" cy="0.4" r="0.6"><stop offset="0" stop-color="#3d4a55"/><stop offset="1" stop-color="#0c1014"/></radialGradient>
  </defs>
  <rect width="${w}" height="${h}" fill="url(#card)"/>
  <rect x="${w * 0.22}" y="${h * 0.2}" width="${w * 0.56}" height="${h * 0.6}" rx="120" fill="#2a2f33"/>
  <rect x="${w * 0.25}" y="${h * 0.24}" width="${w * 0.5}" height="${h * 0.52}" rx="90" fill="#353b40"/>
  <circle cx="${w * 0.4}" cy="${h * 0.5}" r="${h * 0.17}" fill="url(#glass)" stroke="#8a9096" stroke-width="18"/>
  <circle cx="${w * 0.62}" cy="${h * 0.38}" r="${h * 0.05}" fill="#151a1e" stroke="#6d7378" stroke-width="10"/>
  <rect x="${w * 0.56}" y="${h * 0.58}" width="${w * 0.14}" height="${h * 0.1}" rx="20" fill="#b48a3c"/>
</svg>`;
  // Sensor-like noise (seeded), so the file is the size of a real 12 MP photo and not a flat drawing.
  const { data, info } = await sharp(Buffer.from(svg)).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const rnd = mulberry32(SCENE_SEED);
  for (let i = 0; i < data.length; i++) data[i] = clamp(data[i] + Math.round((rnd() - 0.5) * 18), 0, 255);
  return sharp(data, { raw: { width: info.width, height: info.height, channels: info.channels } })
    .jpeg({ quality: 88 })
    .toBuffer();
}

/**
 * 1 000 regions, a quarter of each kind, classes in turn. Coordinates are whole pixels so the
 * set reads back exactly and an unchanged set is recognised (no new version on a rerun).
 */
export function benchRegions(count = REGION_COUNT, seed = SCENE_SEED): RegionSetPayload {
  const rnd = mulberry32(seed);
  const between = (lo: number, hi: number) => lo + rnd() * (hi - lo);
  const x = (margin = 0) => Math.round(between(margin, PHOTO.width - margin));
  const y = (margin = 0) => Math.round(between(margin, PHOTO.height - margin));
  const inside = ([px, py]: Point): Point => [Math.round(clamp(px, 0, PHOTO.width)), Math.round(clamp(py, 0, PHOTO.height))];
  const regions: RegionSetPayload["regions"] = [];
  for (let i = 0; i < count; i++) {
    let shape: Shape;
    switch (i % 4) {
      case 0: {
        const width = Math.round(between(12, 320));
        const height = Math.round(between(12, 240));
        shape = { kind: "rect", x: Math.round(between(0, PHOTO.width - width)), y: Math.round(between(0, PHOTO.height - height)), width, height };
        break;
      }
      case 1: {
        // A star-shaped ring (vertices sorted by angle around a centre): never self-crossing.
        const [cx, cy] = [x(200), y(200)];
        const radius = between(25, 180);
        const n = 5 + Math.floor(rnd() * 8);
        const points: Point[] = [];
        for (let k = 0; k < n; k++) {
          const angle = (k / n) * Math.PI * 2 + between(-0.2, 0.2);
          const r = radius * between(0.6, 1);
          points.push(inside([cx + Math.cos(angle) * r, cy + Math.sin(angle) * r]));
        }
        shape = { kind: "polygon", points };
        break;
      }
      case 2: {
        // A scratch: a walk that keeps its general heading, 2 to 7 points.
        const n = 2 + Math.floor(rnd() * 6);
        let heading = between(0, Math.PI * 2);
        let p: Point = [x(300), y(300)];
        const points: Point[] = [p];
        for (let k = 1; k < n; k++) {
          heading += between(-0.5, 0.5);
          const step = between(30, 160);
          p = inside([p[0] + Math.cos(heading) * step, p[1] + Math.sin(heading) * step]);
          if (p[0] !== points[k - 1][0] || p[1] !== points[k - 1][1]) points.push(p);
        }
        if (points.length < 2) points.push(inside([p[0] + 40, p[1] + 40]));
        shape = { kind: "line", points, width: Math.round(between(2, 14)) };
        break;
      }
      default:
        shape = { kind: "spot", x: x(0), y: y(0), radius: Math.round(between(4, 70)) };
    }
    regions.push({ id: `ui-bench-${String(i + 1).padStart(4, "0")}`, defect: UI_BENCH_DEFECTS[i % UI_BENCH_DEFECTS.length].key, shape });
  }
  return { regions, surfaces: [], ruler: null };
}

/** Key-order-independent form of a region set, to tell whether the stored one is already this one. */
export function canonicalRegions(set: RegionSetPayload): string {
  const sortKeys = (value: unknown): unknown =>
    Array.isArray(value)
      ? value.map(sortKeys)
      : value && typeof value === "object"
        ? Object.fromEntries(
            Object.entries(value as Record<string, unknown>)
              .sort(([a], [b]) => a.localeCompare(b))
              .map(([k, v]) => [k, sortKeys(v)]),
          )
        : value;
  const regions = [...set.regions].sort((a, b) => a.id.localeCompare(b.id));
  return JSON.stringify(sortKeys({ regions, surfaces: set.surfaces, ruler: set.ruler }));
}
