/**
 * ISO 2859-1 switching rules over one supplier + part type's decided lots. Pure: history in,
 * next inspection severity and a sentence explaining it out.
 *
 * Rules (marks as in docs/references.md):
 * - Start (no history) and every entry into normal: switching score 0 (b, ISO 2859-1:1999).
 * - normal → tightened: 2 lots not accepted within 5 or fewer consecutive lots on normal (b).
 * - tightened → normal: 5 consecutive lots accepted on tightened (b).
 * - normal → reduced: switching score >= 30, production steady and the lead has enabled reduced
 *   inspection (b, 1999 edition). The score implies >= 10 consecutive accepted lots; we check both.
 *   Score per lot on normal (b): plan Ac >= 2 → +3 if the lot would have been accepted with the AQL
 *   one step tighter (same sample), else reset to 0; Ac 0 or 1 → +2 if accepted, else reset.
 *   Several defect classes on one lot (our reading, c): any reset resets; otherwise add the smallest
 *   of the classes' points.
 * - reduced → normal: a lot not accepted; a lot accepted with Ac < found < Re (the reduced plans we
 *   use have that gap — Z1.4 §8.3.4 b, a); production irregular; or the lead withdraws approval.
 * - Discontinue: the cumulative number of lots not accepted in the sequence of consecutive lots on
 *   tightened inspection (i.e. since this spell of tightened began) reaches 5 (a, Z1.4 §8.4 text).
 *   Inspection resumes on tightened, counters reset, after the lead records corrective action
 *   (`resumedAfterLotIds`).
 * Each lot's recorded severity is taken as what actually happened (e.g. reduced approved at the
 * time); where it differs from what the rules called for, a note says so.
 */
import { z } from "zod";
import { CODE_LETTERS, INSPECTION_SEVERITIES, judgeLot, SamplingInputError, tighterAcceptNumber, type InspectionSeverity } from "./iso2859";

export const SWITCHING_SCORE_FOR_REDUCED = 30;

const classResultSchema = z
  .object({
    defectClass: z.string().optional(),
    aql: z.number().positive().optional(),
    planLetter: z.enum(CODE_LETTERS).optional(),
    accept: z.number().int().min(0),
    reject: z.number().int().min(1),
    found: z.number().int().min(0),
    /** Ac one AQL step tighter on the same sample; derived from aql + planLetter when absent. */
    tighterAccept: z.number().int().min(0).nullable().optional(),
  })
  .refine((result) => result.reject > result.accept, { error: "reject must be greater than accept" });

const decidedLotSchema = z.object({
  lotId: z.string().min(1),
  severity: z.enum(INSPECTION_SEVERITIES),
  /** The verdict on original inspection (resubmitted lots are left out of the history). */
  accepted: z.boolean(),
  classes: z.array(classResultSchema).min(1, "a lot needs at least one class result"),
});

const switchingInputSchema = z.object({
  history: z.array(decidedLotSchema),
  reducedAllowed: z.boolean(),
  steadyProduction: z.boolean(),
  resumedAfterLotIds: z.array(z.string()).optional(),
});

export type ClassResult = z.infer<typeof classResultSchema>;
export type DecidedLot = z.infer<typeof decidedLotSchema>;
export type SwitchingInput = z.infer<typeof switchingInputSchema>;

export interface Transition {
  afterLotId: string | null;
  from: InspectionSeverity;
  to: InspectionSeverity | "discontinued";
  reason: string;
}

/** Counters describe the state the next lot is inspected under: every switch resets them. */
export interface SwitchingState {
  /** Severity for the next lot (tightened while discontinued: the plan used once resumed). */
  severity: InspectionSeverity;
  /** Why the scheme is in this state, as a sentence for a person. */
  reason: string;
  /** Where the counters stand now, as a sentence. */
  progress: string;
  switchingScore: number;
  consecutiveAcceptedOnNormal: number;
  /** Of the last (up to) 5 lots on normal inspection, how many were not accepted. */
  notAcceptedInLastFiveNormal: number;
  consecutiveAcceptedOnTightened: number;
  lotsNotAcceptedOnTightened: number;
  reducedEligible: boolean;
  discontinued: boolean;
  transitions: Transition[];
  notes: string[];
}

interface Counters {
  severity: InspectionSeverity;
  score: number;
  normalWindow: { lotId: string; notAccepted: boolean }[];
  acceptedOnNormal: number;
  acceptedOnTightened: number;
  notAcceptedOnTightened: number;
  discontinued: boolean;
}

function enter(severity: InspectionSeverity): Counters {
  return { severity, score: 0, normalWindow: [], acceptedOnNormal: 0, acceptedOnTightened: 0, notAcceptedOnTightened: 0, discontinued: false };
}

function plural(count: number, word: string): string {
  return `${count} ${word}${count === 1 ? "" : "s"}`;
}

/** Switching-score points for an accepted normal lot, or null when the score resets. */
function scorePoints(lot: DecidedLot): number | null {
  let smallest = Infinity;
  for (const result of lot.classes) {
    if (result.accept >= 2) {
      const tighter = result.tighterAccept ?? (result.aql !== undefined && result.planLetter !== undefined ? tighterAcceptNumber(result.planLetter, result.aql) : null);
      if (tighter === null || tighter === undefined) {
        throw new SamplingInputError(`lot ${lot.lotId}: a class with Ac >= 2 needs aql and planLetter (or tighterAccept) for the switching score`);
      }
      if (result.found > tighter) return null;
      smallest = Math.min(smallest, 3);
    } else {
      smallest = Math.min(smallest, 2);
    }
  }
  return smallest;
}

function validate(input: unknown): SwitchingInput {
  const parsed = switchingInputSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new SamplingInputError(issue ? `${issue.path.join(".") || "input"}: ${issue.message}` : "invalid switching input");
  }
  for (const lot of parsed.data.history) {
    const judged = lot.classes.map((result) => judgeLot(result, result.found));
    const accepted = judged.every((judgement) => judgement !== "not-accepted");
    if (accepted !== lot.accepted) {
      throw new SamplingInputError(`lot ${lot.lotId}: recorded as ${lot.accepted ? "accepted" : "not accepted"} but its counts say ${accepted ? "accepted" : "not accepted"}`);
    }
  }
  return parsed.data;
}

/** The severity for the next lot of a supplier + part type, and why. */
export function nextInspectionState(input: SwitchingInput): SwitchingState {
  const { history, reducedAllowed, steadyProduction, resumedAfterLotIds = [] } = validate(input);
  let state = enter("normal");
  const transitions: Transition[] = [];
  const notes: string[] = [];
  const switchTo = (to: InspectionSeverity, afterLotId: string | null, reason: string) => {
    transitions.push({ afterLotId, from: state.severity, to, reason });
    state = enter(to);
  };

  let previousLotId: string | null = null;
  for (const lot of history) {
    if (lot.severity !== state.severity && !state.discontinued) {
      const approvedReduced = state.severity === "normal" && lot.severity === "reduced" && state.score >= SWITCHING_SCORE_FOR_REDUCED;
      if (!approvedReduced) notes.push(`Lot ${lot.lotId} was inspected on ${lot.severity} although the rules called for ${state.severity}.`);
      switchTo(
        lot.severity,
        previousLotId,
        approvedReduced
          ? `The switching score was ${state.score} (reduced needs ${SWITCHING_SCORE_FOR_REDUCED}) and reduced inspection was approved → reduced.`
          : `Lot ${lot.lotId} was recorded on ${lot.severity} inspection → ${lot.severity}.`,
      );
    }
    const notAccepted = !lot.accepted;
    if (state.discontinued) {
      notes.push(`Lot ${lot.lotId} was decided while inspection was discontinued.`);
    } else if (state.severity === "normal") {
      state.normalWindow = [...state.normalWindow, { lotId: lot.lotId, notAccepted }].slice(-5);
      const rejected = state.normalWindow.filter((entry) => entry.notAccepted);
      if (notAccepted) {
        state.score = 0;
        state.acceptedOnNormal = 0;
        if (rejected.length >= 2) {
          const ids = rejected.map((entry) => entry.lotId).join(", ");
          switchTo("tightened", lot.lotId, `${rejected.length} of the last ${state.normalWindow.length} lots on normal inspection were not accepted (${ids}) → tightened.`);
        }
      } else {
        state.acceptedOnNormal += 1;
        const points = scorePoints(lot);
        state.score = points === null ? 0 : state.score + points;
      }
    } else if (state.severity === "tightened") {
      if (notAccepted) {
        state.notAcceptedOnTightened += 1;
        state.acceptedOnTightened = 0;
        if (state.notAcceptedOnTightened >= 5) {
          state.discontinued = true;
          transitions.push({
            afterLotId: lot.lotId,
            from: "tightened",
            to: "discontinued",
            reason: `5 lots were not accepted while on tightened inspection (the last was ${lot.lotId}) → inspection discontinued until the supplier has corrected the cause.`,
          });
        }
      } else {
        state.acceptedOnTightened += 1;
        if (state.acceptedOnTightened >= 5) switchTo("normal", lot.lotId, `5 consecutive lots on tightened inspection were accepted (the last was ${lot.lotId}) → normal.`);
      }
    } else {
      const gap = lot.classes.find((result) => judgeLot(result, result.found) === "accept-reinstate-normal");
      if (notAccepted) switchTo("normal", lot.lotId, `Lot ${lot.lotId} was not accepted on reduced inspection → normal.`);
      else if (gap) switchTo("normal", lot.lotId, `Lot ${lot.lotId} was accepted with ${gap.found} found, above Ac ${gap.accept} but below Re ${gap.reject} → normal.`);
    }
    if (state.discontinued && resumedAfterLotIds.includes(lot.lotId)) {
      transitions.push({ afterLotId: lot.lotId, from: "tightened", to: "tightened", reason: `Corrective action was recorded after lot ${lot.lotId} → inspection resumed on tightened.` });
      state = enter("tightened");
    }
    previousLotId = lot.lotId;
  }

  const lastLotId = history.length ? history[history.length - 1].lotId : null;
  const reducedEligible = state.severity === "normal" && !state.discontinued && state.score >= SWITCHING_SCORE_FOR_REDUCED && state.acceptedOnNormal >= 10 && steadyProduction;
  if (reducedEligible && reducedAllowed) {
    switchTo("reduced", lastLotId, `The switching score is ${state.score} (reduced needs ${SWITCHING_SCORE_FOR_REDUCED}), production is steady and the lead has enabled reduced inspection → reduced.`);
  } else if (state.severity === "reduced" && !steadyProduction) {
    switchTo("normal", lastLotId, "Production is irregular or delayed → normal.");
  } else if (state.severity === "reduced" && !reducedAllowed) {
    switchTo("normal", lastLotId, "Reduced inspection is no longer enabled by the lead → normal.");
  }

  const last = transitions[transitions.length - 1];
  const reason = last
    ? last.reason
    : history.length === 0
      ? "No decided lots on record for this supplier and part type → normal inspection (the starting state)."
      : "Normal inspection since the first lot: no switching rule has fired.";
  return {
    severity: state.severity,
    reason,
    progress: describeProgress(state, reducedEligible, reducedAllowed, steadyProduction),
    switchingScore: state.score,
    consecutiveAcceptedOnNormal: state.acceptedOnNormal,
    notAcceptedInLastFiveNormal: state.normalWindow.filter((entry) => entry.notAccepted).length,
    consecutiveAcceptedOnTightened: state.acceptedOnTightened,
    lotsNotAcceptedOnTightened: state.notAcceptedOnTightened,
    reducedEligible,
    discontinued: state.discontinued,
    transitions,
    notes,
  };
}

function describeProgress(state: Counters, reducedEligible: boolean, reducedAllowed: boolean, steadyProduction: boolean): string {
  if (state.discontinued) return "Inspection is discontinued: no lot can be accepted under the scheme until corrective action is recorded.";
  if (state.severity === "tightened") {
    return `Tightened: ${plural(state.acceptedOnTightened, "consecutive lot")} accepted (5 return to normal); ${plural(state.notAcceptedOnTightened, "lot")} not accepted on tightened (5 discontinue inspection).`;
  }
  if (state.severity === "reduced") return "Reduced: stays reduced while lots are accepted within Ac and production is steady.";
  const rejected = state.normalWindow.filter((entry) => entry.notAccepted).length;
  let reducedNote = `switching score ${state.score} of ${SWITCHING_SCORE_FOR_REDUCED} for reduced`;
  if (reducedEligible && !reducedAllowed) reducedNote += " (reached; the lead has not enabled reduced inspection)";
  else if (state.score >= SWITCHING_SCORE_FOR_REDUCED && !steadyProduction) reducedNote += " (reached; production is not steady)";
  return `Normal: ${rejected} of the last ${state.normalWindow.length} lots not accepted (2 switch to tightened); ${reducedNote}.`;
}
