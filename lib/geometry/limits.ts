/**
 * Size limits for what one photo's annotation may hold. They protect the server (payload size,
 * rasterising time) and are generous for real work: a traced part outline rarely needs more than
 * a few hundred vertices. Shared by the editor (which simplifies to stay inside them) and by the
 * save validation (which rejects what is outside them).
 */
export const MAX_POINTS_PER_SHAPE = 5_000;
/** Defect regions per photo. */
export const MAX_REGIONS_PER_PHOTO = 2_000;
/** Surface outlines per photo (several faces or pieces of one part may be visible). */
export const MAX_SURFACES_PER_PHOTO = 20;
/** Vertices over all regions and surfaces of one photo. */
export const MAX_TOTAL_POINTS_PER_PHOTO = 200_000;
export const MAX_ID_LENGTH = 64;
/**
 * Widest Line and largest Spot radius, as shares of the photo's long edge (common practice, our
 * own bound). 5 % of a 4 000 px photo is 200 px, about 7 mm on a phone back shot edge to edge:
 * wider than any scratch or crack (a wider mark is an Outline). A 10 % Spot radius is an 800 px
 * disc, far beyond dust, a dead pixel or a small dent. Never below MIN_SIZE_CAP_PX, so the tools
 * stay usable on small photos.
 */
export const MAX_LINE_WIDTH_SHARE = 0.05;
export const MAX_SPOT_RADIUS_SHARE = 0.1;
export const MIN_SIZE_CAP_PX = 16;
/**
 * Measuring work allowed per photo, in shape rows (lib/imaging/raster/cost.ts: one pixel row of
 * one polygon edge, line segment, box or disc). The cost of measuring grows with this count, not
 * with the photo's size, so this bounds the time and memory of one photo's measurement: the
 * worst set at the limit takes about as long as the 2 s inline measuring budget on a busy 2-CPU
 * machine (`npm run bench -- measure-cost` prints it). Real annotation stays well below: 2 000
 * defects of 200 rows each and a traced Surface come to about 400 000.
 */
export const MAX_RASTER_ROWS_PER_PHOTO = 1_000_000;
/** A ruler longer than 10 m is a typing slip on a parts bench (common practice, our own bound). */
export const MAX_RULER_LENGTH_MM = 10_000;
/**
 * Smallest polygon area accepted, in px². Only there to tell a real outline from rounding noise
 * on a collinear ring; any outline a person can draw is far larger.
 */
export const MIN_POLYGON_AREA = 1e-6;
/** Points closer than this to the line through the others count as on it (px). */
export const COLLINEAR_TOLERANCE = 1e-7;
/**
 * How far past the photo's edge a coordinate may sit, in px. Not a real allowance: it only
 * absorbs floating-point round-off of edits (x + width of a moved box can come out one ulp past
 * the edge), which would otherwise make a save fail for nothing.
 */
export const EDGE_TOLERANCE = 1e-6;
