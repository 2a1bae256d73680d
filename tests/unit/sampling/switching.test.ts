import { describe, expect, it } from "vitest";
import { SamplingInputError, singleSamplingPlan, type InspectionSeverity } from "@/lib/sampling/iso2859";
import { nextInspectionState, type DecidedLot } from "@/lib/sampling/switching";

// Sources (marks as in docs/references.md):
// SW   REFERENCES "Switching rules" (b): 2 of 5 or fewer → tightened; 5 consecutive accepted → normal;
//      score >= 30 + steady + approval → reduced; not accepted → normal; 5 not accepted on tightened
//      → discontinue. The same chart appears on sqconline.com "Switching Rules (ISO 2859-1)" (a).
// Z14  ANSI/ASQ Z1.4 text (123dok copy): §8.3.4 reduced → normal when a lot is rejected, accepted
//      between Ac and Re, or production irregular; §8.4 "If the cumulative number of lots not
//      accepted in a sequence of consecutive lots on tightened inspection reaches 5 …" (a).
// SC   ISO 2859-1:1999 switching score: Ac >= 2 → +3 if accepted one AQL step tighter, else 0;
//      Ac 0/1 → +2 if accepted, else 0; starts at 0 on normal (b, from memory).

// Lot 1000 at level II is letter J. AQL 2.5 normal: n 80, Ac 5 / Re 6; one step tighter (1.5) Ac 3
// (Table 2-A, checked in iso2859.test.ts). AQL 0.65 normal: J, Ac 1 / Re 2.
function lot(lotId: string, found: number, severity: InspectionSeverity = "normal", aql = 2.5): DecidedLot {
  const plan = singleSamplingPlan({ lotSize: 1000, level: "II", aql, severity });
  return {
    lotId,
    severity,
    accepted: found < plan.reject,
    classes: [{ aql, planLetter: plan.planLetter, accept: plan.accept, reject: plan.reject, found }],
  };
}
const run = (history: DecidedLot[], options: Partial<{ reducedAllowed: boolean; steadyProduction: boolean; resumedAfterLotIds: string[] }> = {}) =>
  nextInspectionState({ history, reducedAllowed: false, steadyProduction: true, ...options });
const ACCEPT = 0;
const REJECT = 6; // >= Re 6 on normal; also >= Re 4 on tightened J 2.5 (3/4)

/** Two rejections within five normal lots: the usual way into tightened. */
const intoTightened = () => [lot("n1", REJECT), lot("n2", REJECT)];

describe("nextInspectionState", () => {
  it("starts on normal with a zero score when nothing is on record (SC, b)", () => {
    const state = run([]);
    expect(state).toMatchObject({ severity: "normal", switchingScore: 0, discontinued: false, transitions: [] });
    expect(state.reason).toMatch(/starting state/);
  });

  it("issue scenario: five lots in a row with two rejections switch the next lot's plan to tightened (SW)", () => {
    const history = [lot("lot-1", ACCEPT), lot("lot-2", REJECT), lot("lot-3", 2), lot("lot-4", ACCEPT), lot("lot-5", REJECT)];
    const state = run(history);
    expect(state.severity).toBe("tightened");
    expect(state.reason).toBe("2 of the last 5 lots on normal inspection were not accepted (lot-2, lot-5) → tightened.");
    expect(state.transitions).toEqual([{ afterLotId: "lot-5", from: "normal", to: "tightened", reason: state.reason }]);
    // The next lot's plan: J at 2.5 goes from Ac 5 / Re 6 to Ac 3 / Re 4 (Table 2-B, T1 in iso2859.test.ts).
    expect(singleSamplingPlan({ lotSize: 1000, level: "II", aql: 2.5, severity: state.severity })).toMatchObject({ sampleSize: 80, accept: 3, reject: 4 });
  });

  it("counts only 5 consecutive lots: two rejections six lots apart keep normal (SW)", () => {
    const state = run([lot("a", REJECT), lot("b", 0), lot("c", 0), lot("d", 0), lot("e", 0), lot("f", REJECT)]);
    expect(state.severity).toBe("normal");
    expect(state.notAcceptedInLastFiveNormal).toBe(1);
  });

  it("switches at once on the second rejection, naming the shorter run (SW)", () => {
    const state = run([lot("a", REJECT), lot("b", REJECT)]);
    expect(state.reason).toBe("2 of the last 2 lots on normal inspection were not accepted (a, b) → tightened.");
  });

  it("returns from tightened to normal after 5 consecutive accepted lots, and a rejection restarts the count (SW)", () => {
    const four = [...intoTightened(), ...["t1", "t2", "t3", "t4"].map((id) => lot(id, ACCEPT, "tightened"))];
    expect(run(four)).toMatchObject({ severity: "tightened", consecutiveAcceptedOnTightened: 4 });
    const broken = [...four, lot("t5", REJECT, "tightened"), lot("t6", ACCEPT, "tightened")];
    expect(run(broken)).toMatchObject({ severity: "tightened", consecutiveAcceptedOnTightened: 1, lotsNotAcceptedOnTightened: 1 });
    const back = run([...four, lot("t5", ACCEPT, "tightened")]);
    expect(back.severity).toBe("normal");
    expect(back.reason).toBe("5 consecutive lots on tightened inspection were accepted (the last was t5) → normal.");
    expect(back.switchingScore).toBe(0);
  });

  it("discontinues when 5 lots are not accepted during one spell of tightened, consecutive or not (Z14 §8.4, a)", () => {
    const spell = ["R", "A", "R", "A", "R", "R"].map((kind, index) => lot(`t${index + 1}`, kind === "R" ? REJECT : ACCEPT, "tightened"));
    expect(run([...intoTightened(), ...spell])).toMatchObject({ discontinued: false, lotsNotAcceptedOnTightened: 4 });
    const stopped = run([...intoTightened(), ...spell, lot("t7", REJECT, "tightened")]);
    expect(stopped).toMatchObject({ severity: "tightened", discontinued: true, lotsNotAcceptedOnTightened: 5 });
    expect(stopped.reason).toMatch(/^5 lots were not accepted while on tightened inspection .* → inspection discontinued/);

    const resumed = run([...intoTightened(), ...spell, lot("t7", REJECT, "tightened")], { resumedAfterLotIds: ["t7"] });
    expect(resumed).toMatchObject({ severity: "tightened", discontinued: false, lotsNotAcceptedOnTightened: 0 });
    expect(resumed.reason).toMatch(/resumed on tightened/);
  });

  it("scores +3 per lot within the tighter AQL's Ac on an Ac >= 2 plan and resets on one above it (SC, b)", () => {
    expect(run([lot("a", 3), lot("b", 0)]).switchingScore).toBe(6); // J 2.5: Ac 5, tighter (1.5) Ac 3
    expect(run([lot("a", 3), lot("b", 4)]).switchingScore).toBe(0); // accepted (4 <= 5) but 4 > 3
    expect(run([lot("a", 3), lot("b", 4), lot("c", 1)]).switchingScore).toBe(3);
  });

  it("scores +2 per accepted lot on an Ac 0/1 plan and resets on a rejection (SC, b)", () => {
    const accepted = (count: number) => Array.from({ length: count }, (_, i) => lot(`x${i}`, 1, "normal", 0.65)); // J 0.65: Ac 1 / Re 2
    expect(run(accepted(14)).switchingScore).toBe(28);
    expect(run([...accepted(3), lot("bad", 2, "normal", 0.65), lot("ok", 0, "normal", 0.65)]).switchingScore).toBe(2);
    expect(run(accepted(15), { reducedAllowed: true }).severity).toBe("reduced");
  });

  it("goes to reduced only with score >= 30, steady production and the lead's approval (SW, SC)", () => {
    const ten = Array.from({ length: 10 }, (_, i) => lot(`g${i}`, 2));
    const nine = ten.slice(0, 9);
    expect(run(nine, { reducedAllowed: true })).toMatchObject({ severity: "normal", switchingScore: 27, reducedEligible: false });

    const approved = run(ten, { reducedAllowed: true });
    expect(approved).toMatchObject({ severity: "reduced", reducedEligible: true });
    expect(approved.switchingScore).toBe(0); // counters describe the new state; the reason keeps the score
    expect(approved.reason).toMatch(/^The switching score is 30 \(reduced needs 30\), production is steady and the lead has enabled reduced inspection → reduced\.$/);

    const notEnabled = run(ten, { reducedAllowed: false });
    expect(notEnabled).toMatchObject({ severity: "normal", reducedEligible: true, switchingScore: 30, consecutiveAcceptedOnNormal: 10 });
    expect(notEnabled.progress).toMatch(/the lead has not enabled reduced inspection/);

    const irregular = run(ten, { reducedAllowed: true, steadyProduction: false });
    expect(irregular).toMatchObject({ severity: "normal", reducedEligible: false });
    expect(irregular.progress).toMatch(/production is not steady/);
  });

  const onReduced = () => Array.from({ length: 10 }, (_, i) => lot(`g${i}`, 2));
  // J 1.5 on reduced: n 32, Ac 1 / Re 4 (Table 2-C, b). J 2.5 on reduced: Ac 2 / Re 5.

  it("stays reduced while lots are accepted within Ac", () => {
    expect(run([...onReduced(), lot("r1", 1, "reduced", 1.5)], { reducedAllowed: true }).severity).toBe("reduced");
  });

  it("returns from reduced to normal when a lot is not accepted (SW, Z14 §8.3.4 a)", () => {
    const state = run([...onReduced(), lot("r1", 4, "reduced", 1.5)], { reducedAllowed: true });
    expect(state).toMatchObject({ severity: "normal", switchingScore: 0 });
    expect(state.reason).toBe("Lot r1 was not accepted on reduced inspection → normal.");
  });

  it("returns from reduced to normal when a lot is accepted between Ac and Re (Z14 §8.3.4 b, a)", () => {
    const state = run([...onReduced(), lot("r1", 2, "reduced", 1.5)], { reducedAllowed: true });
    expect(state.severity).toBe("normal");
    expect(state.reason).toBe("Lot r1 was accepted with 2 found, above Ac 1 but below Re 4 → normal.");
  });

  it("returns from reduced to normal when production is irregular or approval is withdrawn (Z14 §8.3.4 c, a)", () => {
    const history = [...onReduced(), lot("r1", 0, "reduced", 1.5)];
    expect(run(history, { reducedAllowed: true, steadyProduction: false }).reason).toBe("Production is irregular or delayed → normal.");
    expect(run(history, { reducedAllowed: false }).severity).toBe("normal");
  });

  it("notes lots recorded on a severity the rules did not call for, and follows the record", () => {
    const state = run([lot("a", 0, "tightened")]);
    expect(state.notes).toEqual(["Lot a was inspected on tightened although the rules called for normal."]);
    expect(state.severity).toBe("tightened");
  });

  const invalid: Array<[string, unknown, RegExp]> = [
    ["a verdict that contradicts the counts", [{ ...lot("a", REJECT), accepted: true }], /lot a: recorded as accepted/],
    ["an Ac >= 2 class without aql and plan letter", [{ lotId: "a", severity: "normal", accepted: true, classes: [{ accept: 5, reject: 6, found: 1 }] }], /needs aql and planLetter/],
    ["an unknown severity", [{ ...lot("a", 0), severity: "strict" }], /history\.0\.severity/],
    ["a lot without class results", [{ lotId: "a", severity: "normal", accepted: true, classes: [] }], /at least one class/],
    ["a negative count", [{ ...lot("a", 0), classes: [{ accept: 1, reject: 2, found: -1 }] }], /found/],
    ["Re not above Ac", [{ ...lot("a", 0), classes: [{ accept: 2, reject: 2, found: 0 }] }], /reject must be greater than accept/],
  ];
  for (const [name, history, message] of invalid) {
    it(`throws SamplingInputError for ${name}`, () => {
      const call = () => nextInspectionState({ history, reducedAllowed: false, steadyProduction: true } as never);
      expect(call).toThrow(SamplingInputError);
      expect(call).toThrow(message);
    });
  }
});
