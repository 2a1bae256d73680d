/**
 * The defects planted on a synthetic part photo (photo-art.ts): each one's SVG and the regions an
 * inspector would mark for it, in the photo's upright pixel coordinates. The regions are the
 * ground truth that the learned-suggestion tests and benchmark train and score against, so they
 * follow what a person draws: a Line a few pixels wider than the visible mark, an Outline around a
 * blot, a Spot per speck. Stroke widths and blur scale with the photo's width (1 at 1 600 px), so
 * a 12 MP render shows the same defects as the demo's 1 600 × 1 200 photos.
 */
import type { Point, PolygonShape, Shape } from "@/lib/geometry/shape";

export type PlantedDefect = "scratch" | "crack" | "stain" | "dust" | "dent" | "chip" | "corrosion" | "swelling" | "torn-flex" | "dead-pixel" | "stuck-pixel";

export type Box = { x: number; y: number; w: number; h: number };
export type Drawn = { svg: string; surface: Box; screen?: Box };
export type PlantedRegion = { defect: PlantedDefect; shape: Shape };

/** A planted mark's class as the part types name it (lib/part-types/starter-catalogue.ts): the
 * pixel faults are named by what the pixel does; every other planted name is already a class key. */
/** A planted part's outline (a rect) as the Surface polygon a region set holds. */
export function surfacePolygon(outline: Shape): PolygonShape {
  const box = outline as Extract<Shape, { kind: "rect" }>;
  return {
    kind: "polygon",
    points: [
      [box.x, box.y],
      [box.x + box.width, box.y],
      [box.x + box.width, box.y + box.height],
      [box.x, box.y + box.height],
    ],
  };
}

export const classKeyOf = (defect: PlantedDefect): string => ({ "dead-pixel": "pixel-dark", "stuck-pixel": "pixel-lit" })[defect as string] ?? defect;
export type Planted = { svg: string; regions: PlantedRegion[] };

/** How much wider than the visible stroke an inspector draws a Line, at 1 600 px (common practice). */
const LINE_MARGIN = 6;

const round = (v: number) => Math.round(v * 100) / 100;
const pt = (x: number, y: number): Point => [round(x), round(y)];

/** An ellipse as an Outline of `sides` vertices. */
function ellipse(cx: number, cy: number, rx: number, ry: number, sides = 32): Shape {
  return { kind: "polygon", points: Array.from({ length: sides }, (_, k) => pt(cx + rx * Math.cos((2 * Math.PI * k) / sides), cy + ry * Math.sin((2 * Math.PI * k) / sides))) };
}

/** Points along the quadratic Bézier P0 → P1 → P2 (the SVG `q` command). */
function quadratic(p0: Point, p1: Point, p2: Point, steps = 10): Point[] {
  return Array.from({ length: steps + 1 }, (_, k) => {
    const t = k / steps;
    const [a, b, c] = [(1 - t) ** 2, 2 * (1 - t) * t, t ** 2];
    return pt(a * p0[0] + b * p1[0] + c * p2[0], a * p0[1] + b * p1[1] + c * p2[1]);
  });
}

/** One defect's SVG and truth regions; `next` is the photo's seeded generator, `u` the width scale. */
export function plantDefect(defect: PlantedDefect, drawn: Drawn, next: () => number, u: number): Planted {
  const s = drawn.surface;
  const at = (margin = 0.15) => ({ x: s.x + s.w * (margin + next() * (1 - 2 * margin)), y: s.y + s.h * (margin + next() * (1 - 2 * margin)) });
  const p = at();
  switch (defect) {
    case "scratch": {
      const len = s.w * (0.25 + next() * 0.3);
      const angle = next() * Math.PI;
      const [dx, dy] = [Math.cos(angle) * len, Math.sin(angle) * len];
      const [cx, cy] = [dx / 2 + 12 * u, dy / 2 - 10 * u];
      const svg = `<path d="M${p.x} ${p.y} q${cx} ${cy} ${dx} ${dy}" stroke="#e9edf0" stroke-width="${2.5 * u}" fill="none" opacity="0.85"/>`;
      const points = quadratic([p.x, p.y], [p.x + cx, p.y + cy], [p.x + dx, p.y + dy]);
      return { svg, regions: [{ defect, shape: { kind: "line", points, width: round((2.5 + LINE_MARGIN) * u) } }] };
    }
    case "crack": {
      const main: Point[] = [pt(p.x, p.y)];
      let d = `M${p.x} ${p.y}`;
      let [x, y] = [p.x, p.y];
      for (let i = 0; i < 9; i++) {
        x += (next() - 0.3) * s.w * 0.08;
        y += (next() - 0.3) * s.h * 0.07;
        d += ` L${x.toFixed(1)} ${y.toFixed(1)}`;
        main.push(pt(x, y));
      }
      const [b1, b2] = [
        [-s.w * 0.06, s.h * 0.05],
        [-s.w * 0.03, s.h * 0.06],
      ];
      const branch = `M${p.x} ${p.y} l${b1[0]} ${b1[1]} l${b2[0]} ${b2[1]}`;
      const svg = `<path d="${d} ${branch}" stroke="#f2f4f5" stroke-width="${3 * u}" fill="none" opacity="0.9"/><path d="${d}" stroke="#1a1a1a" stroke-width="${u}" fill="none" opacity="0.6" transform="translate(${2 * u} ${2 * u})"/>`;
      // The shadow sits 2 px below-right of the bright line: the Line covers both.
      const width = round((3 + 2 + LINE_MARGIN) * u);
      const branchPoints = [pt(p.x, p.y), pt(p.x + b1[0], p.y + b1[1]), pt(p.x + b1[0] + b2[0], p.y + b1[1] + b2[1])];
      return {
        svg,
        regions: [
          { defect, shape: { kind: "line", points: main, width } },
          { defect, shape: { kind: "line", points: branchPoints, width } },
        ],
      };
    }
    case "stain": {
      const [rx, ry] = [s.w * 0.09, s.w * 0.06];
      return { svg: `<ellipse cx="${p.x}" cy="${p.y}" rx="${rx}" ry="${ry}" fill="#8a6a3a" opacity="0.45" filter="url(#soft)"/>`, regions: [{ defect, shape: ellipse(p.x, p.y, rx, ry) }] };
    }
    case "dust": {
      const specks = Array.from({ length: 40 }, () => {
        const q = at(0.05);
        return { x: Number(q.x.toFixed(1)), y: Number(q.y.toFixed(1)), r: Number(((1 + next() * 2.5) * u).toFixed(1)) };
      });
      return {
        svg: specks.map((q) => `<circle cx="${q.x}" cy="${q.y}" r="${q.r}" fill="#d7d2c8" opacity="0.8"/>`).join(""),
        regions: specks.map((q) => ({ defect, shape: { kind: "spot", x: q.x, y: q.y, radius: round(q.r + u) } })),
      };
    }
    case "dent": {
      const [rx, ry] = [s.w * 0.07, s.w * 0.045];
      return { svg: `<ellipse cx="${p.x}" cy="${p.y}" rx="${rx}" ry="${ry}" fill="url(#dent)"/>`, regions: [{ defect, shape: ellipse(p.x, p.y, rx, ry) }] };
    }
    case "chip": {
      const x = s.x + s.w * (0.2 + next() * 0.6);
      const points = [pt(x, s.y - 3), pt(x + s.w * 0.05, s.y - 3), pt(x + s.w * 0.03, s.y - 3 + s.w * 0.03)];
      return { svg: `<path d="M${x} ${s.y - 3} l${s.w * 0.05} 0 l${-s.w * 0.02} ${s.w * 0.03} z" fill="#cfd6dc"/>`, regions: [{ defect, shape: { kind: "polygon", points } }] };
    }
    case "corrosion": {
      const [rx, ry] = [s.w * 0.05, s.w * 0.04];
      const svg = `<ellipse cx="${p.x}" cy="${p.y}" rx="${rx}" ry="${ry}" fill="#4f8f6a" opacity="0.7" filter="url(#soft)"/><ellipse cx="${p.x + 8 * u}" cy="${p.y + 5 * u}" rx="${s.w * 0.025}" ry="${s.w * 0.02}" fill="#b6c98c" opacity="0.8"/>`;
      return { svg, regions: [{ defect, shape: ellipse(p.x, p.y, rx, ry) }] };
    }
    case "swelling": {
      const [cx, cy, rx, ry] = [s.x + s.w / 2, s.y + s.h / 2, s.w * 0.38, s.h * 0.3];
      return { svg: `<ellipse cx="${cx}" cy="${cy}" rx="${rx}" ry="${ry}" fill="url(#bulge)"/>`, regions: [{ defect, shape: ellipse(cx, cy, rx, ry) }] };
    }
    case "torn-flex": {
      // Across a flex strip when the part is one; otherwise through the tab above the body.
      const strip = s.w > 3 * s.h;
      const x = strip ? s.x + s.w * (0.3 + next() * 0.4) : s.x + s.w * 0.69;
      const [top, len] = strip ? [s.y - 2, s.h + 4] : [s.y - s.h * 0.105, s.h * 0.05];
      const steps: Point[] = [
        [len * 0.15, len * 0.4],
        [-len * 0.12, len * 0.25],
        [len * 0.1, len * 0.35],
      ];
      const points: Point[] = [pt(x, top)];
      for (const [dx, dy] of steps) points.push(pt(points[points.length - 1][0] + dx, points[points.length - 1][1] + dy));
      const svg = `<path d="M${x} ${top} ${steps.map(([dx, dy]) => `l${dx} ${dy}`).join(" ")}" stroke="#3a2a1a" stroke-width="${5 * u}" fill="none"/>`;
      return { svg, regions: [{ defect, shape: { kind: "line", points, width: round((5 + LINE_MARGIN) * u) } }] };
    }
    case "dead-pixel":
    case "stuck-pixel": {
      const screen = drawn.screen ?? s;
      const q = { x: Number((screen.x + screen.w * (0.2 + next() * 0.6)).toFixed(0)), y: Number((screen.y + screen.h * (0.15 + next() * 0.3)).toFixed(0)) };
      const colour = defect === "dead-pixel" ? "#000000" : ["#ff0000", "#00ff00", "#ffffff"][Math.floor(next() * 3)];
      return {
        svg: `<rect x="${q.x}" y="${q.y}" width="3" height="3" fill="${colour}" shape-rendering="crispEdges"/>`,
        regions: [{ defect, shape: { kind: "spot", x: q.x + 1.5, y: q.y + 1.5, radius: 2.5 } }],
      };
    }
  }
}
