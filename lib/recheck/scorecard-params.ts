/**
 * The scorecards screen's URL (`/recheck/scorecards?from=&to=&grader=`): the API's period plus
 * the grader whose card is shown (none = the team). Read with lib/url-state on the server page:
 * a bad date or a grader not in the period falls back and is named, never an error page.
 */
import { z } from "zod";
import { isUuid } from "@/lib/validation";
import { scorecardPeriodShape, withPeriodRules } from "./schemas";

export const scorecardPageSchema = withPeriodRules(
  z.strictObject({
    ...scorecardPeriodShape,
    grader: z
      .string()
      .refine(isUuid, "is not a valid id")
      .transform((value) => value.toLowerCase())
      .optional(),
  }),
);
export type ScorecardPageParams = z.infer<typeof scorecardPageSchema>;

/** The screen's link for a period and grader, defaults left out (one view, one URL). */
export function scorecardHref(params: ScorecardPageParams): string {
  const query = new URLSearchParams();
  if (params.from) query.set("from", params.from);
  if (params.to) query.set("to", params.to);
  if (params.grader) query.set("grader", params.grader);
  const text = query.toString();
  return text ? `/recheck/scorecards?${text}` : "/recheck/scorecards";
}
