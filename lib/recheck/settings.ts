/**
 * A workspace's recheck settings (a lead edits them; the draw, the adjudication trigger and the
 * scorecards' drift flag read them). Shares are fractions 0–1; forms show percentages.
 * The defaults are our own starting points (c), each explained where it is used:
 * draw.ts (rates, minimum), adjudication.ts (IoU threshold, meaningful area), drift.ts (drift).
 */
import { z } from "zod";

const share = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .min(0, `${what} must be at least 0.`)
    .max(1, `${what} must be at most 1 (100 %).`);

export const recheckSettingsSchema = z
  .object({
    /** Share of each grader's graded units drawn per week. */
    rate: share("The recheck rate").refine((value) => value > 0, "The recheck rate must be above 0."),
    /** The rate for graders whose last calibration failed or whose agreement drifts. */
    raisedRate: share("The raised recheck rate"),
    /** At least this many per grader and week (when they graded that many). */
    minimumPerGrader: z.number().int("The minimum per grader is a whole number.").min(0).max(100),
    /** A class's IoU below this (with a meaningful area marked) sends the unit to adjudication. */
    iouThreshold: share("The IoU threshold"),
    /** A marked area is meaningful from this share of the photo's Surface … */
    meaningfulShare: share("The meaningful area share"),
    /** … and from at least this many pixels. */
    meaningfulPx: z.number().int("The meaningful area is a whole number of pixels.").min(0).max(10_000_000),
    /** Exact agreement below this over the drift window flags a grader. */
    driftAgreement: share("The drift threshold"),
    /** Weeks the drift flag looks back over (the week in progress included). */
    driftWeeks: z.number().int().min(1, "The drift window is at least one week.").max(26, "The drift window is at most 26 weeks."),
    /** Fewer rechecks than this in the window never flag against the threshold. */
    driftMinRechecks: z.number().int().min(1).max(1000),
  })
  .strict()
  .refine((settings) => settings.raisedRate >= settings.rate, { message: "The raised rate must be at least the normal rate.", path: ["raisedRate"] });
export type RecheckSettings = z.infer<typeof recheckSettingsSchema>;

export const DEFAULT_RECHECK_SETTINGS: RecheckSettings = {
  rate: 0.05,
  raisedRate: 0.2,
  minimumPerGrader: 1,
  iouThreshold: 0.5,
  meaningfulShare: 0.0005,
  meaningfulPx: 100,
  driftAgreement: 0.8,
  driftWeeks: 4,
  driftMinRechecks: 5,
};
