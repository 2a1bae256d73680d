/**
 * Validation of one photo's region set before it is saved: structure and finite numbers with zod,
 * then the geometry rules of degenerate.ts, each failure as a sentence that names the region,
 * e.g. "Region 3 (Outline): a polygon needs at least 3 points that are not on one line.".
 *
 * Decisions: coordinates must lie in [0, width] × [0, height], with only EDGE_TOLERANCE (1e-6 px)
 * for floating-point round-off (the editor clamps every pointer position, so only foreign data
 * can fall outside); spot radii and line widths may
 * reach past the edge (clamp.ts says why); a line that only runs back and forth between 2 points
 * (a → b → a, "self-closing") is rejected, a closed loop over 3 or more points is a valid scratch;
 * polygons may repeat points (the ring closes itself; repeats change neither area nor coverage).
 */
import { z } from "zod";
import type { ImageSize } from "./clamp";
import { describeOutsideImage, describeShapeProblem, pointInsideImage } from "./degenerate";
import { MAX_ID_LENGTH, MAX_POINTS_PER_SHAPE, MAX_RASTER_ROWS_PER_PHOTO, MAX_REGIONS_PER_PHOTO, MAX_RULER_LENGTH_MM, MAX_SURFACES_PER_PHOTO, MAX_TOTAL_POINTS_PER_PHOTO } from "./limits";
import { rasterRows } from "@/lib/imaging/raster/cost";
import { pointsEqual } from "./points";
import type { Shape, ShapeKind } from "./shape";
import { coordinateSchema, lineShapeSchema, pointSchema, polygonShapeSchema, rectShapeSchema, spotShapeSchema } from "./shape-schemas";

export type RegionSetContext = ImageSize & { allowedDefects: readonly string[] };

/** One photo's saved regions, surface outlines and ruler: what regionSetSchema returns. */
export type RegionSetPayload = z.output<ReturnType<typeof regionSetSchema>>;

/** The tool names of docs/contracts.md, used to name a region in messages. */
export const TOOL_NAME_BY_KIND: Record<ShapeKind, string> = { rect: "Box", polygon: "Outline", line: "Line", spot: "Spot" };

const finite = coordinateSchema;
const point = pointSchema;
const points = z.array(point, { error: "must be a list of [x, y] points" }).max(MAX_POINTS_PER_SHAPE, `may hold at most ${MAX_POINTS_PER_SHAPE} points`);
const objectError = (what: string) => ({
  error: (issue: { code?: string; keys?: string[] }) => (issue.code === "unrecognized_keys" ? `has unknown field(s) ${issue.keys?.join(", ")}` : `must be ${what}`),
});
const id = z
  .string({ error: "must be text" })
  .min(1, "must not be empty")
  .max(MAX_ID_LENGTH, `must be at most ${MAX_ID_LENGTH} characters`)
  .regex(/^[A-Za-z0-9_-]*$/, "may only use letters, digits, - and _");

// The saved variant of the base shapes (shape-schemas.ts): unknown fields refused, point budgets.
const rectSchema = z.strictObject(rectShapeSchema.shape, objectError("a box"));
const polygonSchema = z.strictObject({ ...polygonShapeSchema.shape, points }, objectError("an outline"));
const lineSchema = z.strictObject({ ...lineShapeSchema.shape, points }, objectError("a line"));
const spotSchema = z.strictObject(spotShapeSchema.shape, objectError("a spot"));

/** Any region shape, structure only (a known kind, finite numbers); geometry is checked separately. */
export const shapeStructureSchema = z.discriminatedUnion("kind", [rectSchema, polygonSchema, lineSchema, spotSchema], {
  error: 'must be "rect", "polygon", "line" or "spot"',
});

function geometryCheck(size: ImageSize) {
  return (shape: Shape, ctx: z.RefinementCtx) => {
    const problem = describeShapeProblem(shape) ?? describeOutsideImage(shape, size);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  };
}

function describeAllowed(allowed: readonly string[]): string {
  const shown = allowed.slice(0, 12).join(", ");
  return allowed.length > 12 ? `${shown}, …` : shown;
}

/** The zod schema of one photo's region set save, for this photo's size and part type. */
export function regionSetSchema(context: RegionSetContext) {
  const size = { width: context.width, height: context.height };
  if (!(size.width > 0 && size.height > 0 && Number.isFinite(size.width) && Number.isFinite(size.height))) {
    throw new RangeError(`regionSetSchema needs a positive photo size, got ${size.width} × ${size.height}`);
  }
  const allowed = new Set(context.allowedDefects);
  const shape = shapeStructureSchema.superRefine(geometryCheck(size));
  const defect = z.string({ error: "must be text" }).superRefine((value, ctx) => {
    if (!allowed.has(value)) {
      ctx.addIssue({ code: "custom", message: `“${value}” is not allowed for this part type (allowed: ${describeAllowed(context.allowedDefects)})` });
    }
  });
  const region = z.strictObject({ id, defect, shape }, objectError("an object with id, defect and shape"));
  const surface = z.strictObject({ id, shape: polygonSchema.superRefine(geometryCheck(size)) }, objectError("an object with id and a polygon shape"));
  const ruler = z
    .strictObject(
      { id, a: point, b: point, lengthMm: finite.gt(0, "must be more than 0 mm").max(MAX_RULER_LENGTH_MM, `must be at most ${MAX_RULER_LENGTH_MM} mm`) },
      objectError("an object with id, a, b and lengthMm"),
    )
    .superRefine((value, ctx) => {
      if (pointsEqual(value.a, value.b)) ctx.addIssue({ code: "custom", message: "a ruler needs two different end points." });
      for (const end of ["a", "b"] as const) {
        if (!pointInsideImage(value[end], size)) ctx.addIssue({ code: "custom", path: [end], message: `lies outside the ${size.width} × ${size.height} px photo` });
      }
    });
  return z
    .strictObject(
      {
        regions: z.array(region, { error: "must be a list" }).max(MAX_REGIONS_PER_PHOTO, `may hold at most ${MAX_REGIONS_PER_PHOTO} regions per photo`),
        surfaces: z.array(surface, { error: "must be a list" }).max(MAX_SURFACES_PER_PHOTO, `may hold at most ${MAX_SURFACES_PER_PHOTO} surface outlines per photo`).default([]),
        ruler: ruler.nullable().default(null),
      },
      objectError("an object with regions, surfaces and ruler"),
    )
    .superRefine((set, ctx) => {
      const seen = new Map<string, string>();
      const note = (value: string, where: string, path: (string | number)[]) => {
        const earlier = seen.get(value);
        if (earlier) ctx.addIssue({ code: "custom", path: [...path, "id"], message: `“${value}” is already used by ${earlier}` });
        else seen.set(value, where);
      };
      set.regions.forEach((r, i) => note(r.id, `region ${i + 1}`, ["regions", i]));
      set.surfaces.forEach((s, i) => note(s.id, `surface ${i + 1}`, ["surfaces", i]));
      if (set.ruler) note(set.ruler.id, "the ruler", ["ruler"]);
      const total = [...set.regions, ...set.surfaces].reduce((sum, r) => sum + ("points" in r.shape ? r.shape.points.length : 0), 0);
      if (total > MAX_TOTAL_POINTS_PER_PHOTO) {
        ctx.addIssue({ code: "custom", message: `the photo's regions hold ${total} points in all; at most ${MAX_TOTAL_POINTS_PER_PHOTO} are allowed (simplify the longest outlines).` });
        return;
      }
      // What measuring these shapes would cost (lib/imaging/raster/cost.ts), refused before it is stored.
      const rows = rasterRows(
        [...set.regions, ...set.surfaces].map((r) => r.shape),
        size,
      );
      if (rows > MAX_RASTER_ROWS_PER_PHOTO) ctx.addIssue({ code: "custom", message: describeRasterBudget(rows) });
    });
}

/** The sentence for a region set that would cost too much to measure (also used when measuring). */
export function describeRasterBudget(rows: number): string {
  const millions = (n: number) => `${(n / 1_000_000).toFixed(1)} million`;
  return `these regions would take too long to measure: their edges and lines cross ${millions(rows)} pixel rows in all, at most ${millions(MAX_RASTER_ROWS_PER_PHOTO)} are allowed per photo (use fewer or smaller regions, or fewer points on long zigzag outlines).`;
}

export type RegionSetResult = { ok: true; value: RegionSetPayload } | { ok: false; messages: string[] };

/** At most this many messages are returned; the rest are summed up in one last line. */
export const MAX_MESSAGES = 20;

export function parseRegionSet(input: unknown, context: RegionSetContext): RegionSetResult {
  const result = regionSetSchema(context).safeParse(input);
  if (result.success) return { ok: true, value: result.data };
  return { ok: false, messages: describeIssues(result.error.issues, input) };
}

/** Turns zod issues into sentences that name the region, e.g. "Region 2 (Spot): the radius must be a finite number.". */
export function describeIssues(issues: readonly z.core.$ZodIssue[], input: unknown): string[] {
  const messages = issues.slice(0, MAX_MESSAGES).map((issue) => describeIssue(issue, input));
  if (issues.length > MAX_MESSAGES) messages.push(`…and ${issues.length - MAX_MESSAGES} more problems.`);
  return messages;
}

function describeIssue(issue: z.core.$ZodIssue, input: unknown): string {
  const path = issue.path as (string | number)[];
  const [section, index] = path;
  let subject = "Region set";
  let rest = path;
  if (section === "regions" && typeof index === "number") {
    const kind = kindAt(input, index);
    subject = kind ? `Region ${index + 1} (${TOOL_NAME_BY_KIND[kind]})` : `Region ${index + 1}`;
    rest = path.slice(2);
  } else if (section === "surfaces" && typeof index === "number") {
    subject = `Surface ${index + 1}`;
    rest = path.slice(2);
  } else if (section === "ruler") {
    subject = "Ruler";
    rest = path.slice(1);
  } else if (typeof section === "string") {
    subject = section === "regions" ? "Regions" : section === "surfaces" ? "Surfaces" : `Field “${section}”`;
    rest = path.slice(1);
  }
  // A geometry rule on the whole shape reads best without a field name.
  const wholeShape = rest.length === 1 && rest[0] === "shape" && issue.code === "custom";
  const field = wholeShape ? "" : describeField(rest[0] === "shape" && rest.length > 1 ? rest.slice(1) : rest);
  const sentence = field ? `${field} ${issue.message}` : issue.message;
  return `${subject}: ${sentence}${/[.!?]$/.test(sentence) ? "" : "."}`;
}

function kindAt(input: unknown, index: number): ShapeKind | null {
  const kind = (input as { regions?: { shape?: { kind?: unknown } }[] } | null)?.regions?.[index]?.shape?.kind;
  return typeof kind === "string" && Object.hasOwn(TOOL_NAME_BY_KIND, kind) ? (kind as ShapeKind) : null;
}

const FIELD_NAMES: Record<string, string> = {
  defect: "the defect class",
  id: "the id",
  shape: "the shape",
  radius: "the radius",
  width: "the width",
  height: "the height",
  lengthMm: "the length",
};

function describeField(path: (string | number)[]): string {
  if (path.length === 0) return "";
  const [head, index, axis] = path;
  const axisName = (n: string | number) => (n === 0 ? "x" : "y");
  if (head === "points") {
    if (index === undefined) return "the points";
    const which = `point ${(index as number) + 1}`;
    return axis === undefined ? which : `${axisName(axis)} of ${which}`;
  }
  if (head === "a" || head === "b") return index === undefined ? `end ${head}` : `${axisName(index)} of end ${head}`;
  return FIELD_NAMES[head] ?? String(head);
}
