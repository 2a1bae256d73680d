/**
 * measureCoverage against a general-purpose exact polygon library: polygon-clipping 0.15.7
 * (npm; union / intersection of polygons, MultiPolygon output) with areas by the shoelace
 * formula, outer ring minus holes (docs/references.md, "Areas and images"). Scenes come from a seeded
 * PRNG so a failure reproduces. Tolerance: 1 % of the exact area (the contract's accuracy target).
 */
import { readFileSync, readdirSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import type { MultiPolygon } from "polygon-clipping";
import type { Shape } from "@/lib/geometry/shape";
import type { CoverageInput } from "@/lib/measure/types";
import { measureCoverage, type CoverageOptions } from "@/lib/imaging/coverage";
import { exactUnion, multiPolygonArea, polygonClipping, starPolygon } from "@/support/exact-areas";
import { mulberry32 as seededRandom } from "@/support/prng";

function referenceCoverage(input: CoverageInput) {
  const image = exactUnion([{ kind: "rect", x: 0, y: 0, width: input.width, height: input.height }]);
  const surface = polygonClipping.intersection(input.surface?.length ? exactUnion(input.surface) : image, image);
  const defects = [...new Set(input.regions.map((region) => region.defect))];
  const classArea = (defect: string, within: MultiPolygon) =>
    multiPolygonArea(polygonClipping.intersection(exactUnion(input.regions.filter((region) => region.defect === defect).map((region) => region.shape)), within));
  const zones = (input.zones ?? []).map((zone) => ({ id: zone.id, clipped: polygonClipping.intersection(exactUnion([zone.shape]), surface) }));
  return {
    surfaceArea: multiPolygonArea(surface),
    byDefect: Object.fromEntries(defects.map((defect) => [defect, classArea(defect, surface)])),
    byZone: Object.fromEntries(
      zones.map((zone) => [zone.id, { zoneArea: multiPolygonArea(zone.clipped), byDefect: Object.fromEntries(defects.map((defect) => [defect, classArea(defect, zone.clipped)])) }]),
    ),
  };
}

function randomScene(seed: number, withCurves: boolean): CoverageInput {
  const random = seededRandom(seed);
  const width = 640;
  const height = 480;
  const regions: CoverageInput["regions"] = [];
  const defects = ["dent", "chip", "scratch"];
  for (let k = 0; k < 18; k++) {
    const defect = defects[k % 3];
    // Clustered centres so regions overlap; some stick out of the image.
    const cx = 60 + random() * 560 - 40;
    const cy = 60 + random() * 380 - 20;
    let shape: Shape = starPolygon(random, cx, cy, 40 + random() * 80);
    // Radii within the Spot cap (10 % of the 640 px long edge, lib/geometry/limits.ts).
    if (withCurves && k % 3 === 1) shape = { kind: "spot", x: cx, y: cy, radius: 15 + random() * 49 };
    if (withCurves && k % 3 === 2) {
      shape = {
        kind: "line",
        points: [
          [cx, cy],
          [cx + 80 + random() * 150, cy + random() * 120 - 60],
          [cx + random() * 200, cy + 100 + random() * 60],
        ],
        width: 4 + random() * 14,
      };
    }
    regions.push({ id: `r${k}`, defect, shape });
  }
  return {
    width,
    height,
    regions,
    // A large surface, so most of each class lies inside it (thin clipped slivers have a large
    // outline per pixel, where any pixel rule's relative error is large).
    surface: [starPolygon(random, 320, 240, 330, 0.8), { kind: "rect", x: 0.37, y: 380.25, width: 300.5, height: 90 }],
    zones: [
      { id: "lens", shape: { kind: "spot", x: 200 + random() * 100, y: 180 + random() * 80, radius: 130 } },
      { id: "band", shape: starPolygon(random, 420, 260, 200) },
    ],
  };
}

/**
 * Any pixel-centre rule errs by up to ½ px per pixel of outline running along a row (a long,
 * nearly horizontal edge decides whole runs at once), so the 1 % target applies to substantial
 * areas: the surface, each class and each zone here are several thousand px². Zone ∩ class pieces
 * below MIN_COMPARED_AREA are not compared (brute-force checks of the rule cover them in
 * coverage-raster.test.ts); the tests count the comparisons so they cannot silently run empty.
 */
const MIN_COMPARED_AREA = 2000;
const withinOnePercent = (measured: number, exact: number, label: string) => {
  expect(exact, label).toBeGreaterThanOrEqual(MIN_COMPARED_AREA);
  expect(Math.abs(measured - exact) / exact, `${label}: ${measured} px vs exact ${exact.toFixed(1)}`).toBeLessThan(0.01);
};

describe.each<CoverageOptions["regionRaster"]>(["sharp", "exact"])("measureCoverage vs polygon-clipping (regionRaster %s)", (regionRaster) => {
  it.each([1, 2, 3, 4])("random overlapping polygons, seed %i: surface, class and zone areas within 1 %", async (seed) => {
    const scene = randomScene(seed, false);
    const measured = await measureCoverage(scene, { regionRaster });
    const reference = referenceCoverage(scene);
    // The scenes really overlap (else "union" would be untested): the union is smaller than the sum.
    const sumOfParts = scene.regions.reduce((sum, region) => sum + multiPolygonArea(exactUnion([region.shape])), 0);
    expect(Object.values(reference.byDefect).reduce((sum, area) => sum + area, 0)).toBeLessThan(0.95 * sumOfParts);
    withinOnePercent(measured.surfacePx, reference.surfaceArea, "surface");
    for (const [defect, area] of Object.entries(reference.byDefect)) withinOnePercent(measured.byDefect[defect].px, area, defect);
    let comparedPieces = 0;
    for (const [zoneId, zone] of Object.entries(reference.byZone)) {
      withinOnePercent(measured.byZone[zoneId].zonePx, zone.zoneArea, zoneId);
      for (const [defect, area] of Object.entries(zone.byDefect)) {
        if (area < MIN_COMPARED_AREA) continue;
        withinOnePercent(measured.byZone[zoneId].byDefect[defect].px, area, `${zoneId}/${defect}`);
        comparedPieces++;
      }
    }
    expect(comparedPieces).toBeGreaterThanOrEqual(2);
  });

  it.each([5, 6])("random polygons, discs and bent round-joined lines, seed %i: class areas within 1 %", async (seed) => {
    const scene = randomScene(seed, true);
    const measured = await measureCoverage(scene, { regionRaster });
    const reference = referenceCoverage(scene);
    for (const [defect, area] of Object.entries(reference.byDefect)) withinOnePercent(measured.byDefect[defect].px, area, defect);
  });
});

describe("trap: @turf/area is geodesic (square metres on the globe), not a pixel area", () => {
  it("our reference area is planar: a 100 × 100 px square has area 10 000 wherever it sits", () => {
    // Source: shoelace formula (a, geometry). A geodesic area would read the numbers as degrees and
    // change with "latitude" y (and be undefined beyond ±90), so it must not be the reference.
    const square = (x: number, y: number): MultiPolygon => [
      [
        [
          [x, y],
          [x + 100, y],
          [x + 100, y + 100],
          [x, y + 100],
          [x, y],
        ],
      ],
    ];
    expect(multiPolygonArea(square(0, 0))).toBe(10_000);
    expect(multiPolygonArea(square(2000, 2900))).toBe(10_000);
  });

  it("the coverage code and the project's dependencies do not use @turf/area", () => {
    // Source: docs/references.md, "Areas and images" (trap).
    const root = process.cwd();
    const manifest = JSON.parse(readFileSync(join(root, "package.json"), "utf8")) as Record<string, Record<string, string> | undefined>;
    expect({ ...manifest.dependencies, ...manifest.devDependencies }).not.toHaveProperty("@turf/area");
    const sources = ["lib/imaging/coverage.ts", ...readdirSync(join(root, "lib/imaging/raster")).map((name) => `lib/imaging/raster/${name}`)];
    for (const file of sources) expect(readFileSync(join(root, file), "utf8"), file).not.toMatch(/@turf\//);
  });
});
