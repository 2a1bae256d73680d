/**
 * Checklist limit evaluation: inclusive limits, rounding to the item's decimals, failure sentences.
 * Sources (marks as in docs/references.md):
 * DEC  decimal.js-light 2.5.1 (npm, general-purpose decimal arithmetic), ROUND_HALF_UP = "rounds
 *      towards nearest neighbour; if equidistant, away from zero" (a, its documentation) — the
 *      reference for our rounding of typed decimals.
 * LIM  Inclusive limits (min <= reading <= max): common practice (c) for bench limits.
 * BAT  Phone cells: full charge 4.20–4.40 V, device cut-off about 3.0 V (a, docs/references.md).
 * SUS  Protection circuits open at about 2.5 V and such packs may not charge normally (a, Battery
 *      University BU-802c via docs/references.md); below 2.5 V treat the cell as suspect (c).
 */
import Decimal from "decimal.js-light";
import { describe, expect, it } from "vitest";
import { decimalPlaces, describeLimits, evaluateChecklistItem, roundToDecimals, suspectReading } from "@/lib/checklist/evaluate";
import { AppError } from "@/lib/errors";
import type { ChecklistItem } from "@/lib/part-types/schemas";

type Numeric = Extract<ChecklistItem, { kind: "numeric" }>;
const voltage: Numeric = { id: "ocv", label: "Open-circuit voltage", kind: "numeric", unit: "V", min: 3.0, max: 4.4, decimals: 2, severityOnFail: "major" };
const reading = (item: Numeric, value: number) => evaluateChecklistItem(item, { reading: value });

describe("numeric limits (LIM, c; BAT, a)", () => {
  it("passes readings on both limits and fails one step outside", () => {
    expect(reading(voltage, 3.0).passed).toBe(true);
    expect(reading(voltage, 4.4).passed).toBe(true);
    expect(reading(voltage, 2.99)).toEqual({ passed: false, failureReason: "2.99 V is below the minimum 3.00 V.", value: { reading: 2.99 } });
    expect(reading(voltage, 4.41)).toEqual({ passed: false, failureReason: "4.41 V is above the maximum 4.40 V.", value: { reading: 4.41 } });
  });

  it("rounds to the item's decimals before comparing: 2.995 → 3.00 passes, 2.9949 → 2.99 fails (DEC)", () => {
    expect(reading(voltage, 2.995)).toMatchObject({ passed: true, value: { reading: 3 } });
    expect(reading(voltage, 2.9949)).toMatchObject({ passed: false, value: { reading: 2.99 } });
    expect(reading(voltage, 4.4049)).toMatchObject({ passed: true, value: { reading: 4.4 } });
    expect(reading(voltage, 4.405)).toMatchObject({ passed: false, failureReason: "4.41 V is above the maximum 4.40 V." });
  });

  it("a deeply discharged cell fails with the reason the bench shows (BAT)", () => {
    expect(reading(voltage, 2.48).failureReason).toBe("2.48 V is below the minimum 3.00 V.");
  });

  it("handles whole-number items, one-sided limits and items without limits", () => {
    const health: Numeric = { ...voltage, id: "health", unit: "%", min: 80, max: 100, decimals: 0 };
    expect(reading(health, 80).passed).toBe(true);
    expect(reading(health, 79.5)).toMatchObject({ passed: true, value: { reading: 80 } }); // half away from zero (DEC)
    expect(reading(health, 79.49).passed).toBe(false);
    const atLeast: Numeric = { ...voltage, min: 350, max: null, decimals: 0, unit: "cd/m²" };
    expect(reading(atLeast, 1e6).passed).toBe(true);
    expect(reading(atLeast, 349).failureReason).toBe("349 cd/m² is below the minimum 350 cd/m².");
    const any: Numeric = { ...voltage, min: null, max: null };
    expect(reading(any, -12.345)).toEqual({ passed: true, failureReason: null, value: { reading: -12.35 } });
    expect(describeLimits(voltage)).toBe("3.00–4.40 V");
    expect(describeLimits(atLeast)).toBe("at least 350 cd/m²");
    expect(describeLimits(any)).toBe("any value (recorded only)");
  });

  it("negative limits work symmetrically (a temperature offset item)", () => {
    const offset: Numeric = { ...voltage, unit: "°C", min: -2.5, max: 2.5, decimals: 1 };
    expect(reading(offset, -2.5).passed).toBe(true);
    expect(reading(offset, -2.55)).toMatchObject({ passed: false, value: { reading: -2.6 } }); // away from zero (DEC)
    expect(reading(offset, -2.549).passed).toBe(true);
  });

  it("refuses non-finite and implausible readings with a clear error", () => {
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, 1e15]) {
      expect(() => reading(voltage, bad)).toThrow(AppError);
    }
  });
});

describe("rounding agrees with decimal.js-light ROUND_HALF_UP on typed decimals (DEC, a)", () => {
  it("over a sweep of 3-decimal readings, including every .xx5 tie", () => {
    for (let thousandths = -5000; thousandths <= 5000; thousandths += 1) {
      const typed = (thousandths / 1000).toFixed(3);
      const expected = Number(new Decimal(typed).toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toString());
      expect(roundToDecimals(Number(typed), 2), typed).toBe(expected);
    }
  });

  it("on values whose binary double lies below the tie (1.005, 2.675, 8.345)", () => {
    for (const typed of ["1.005", "2.675", "8.345", "0.045", "1234.5675"]) {
      const places = typed.split(".")[1].length - 1;
      const expected = Number(new Decimal(typed).toDecimalPlaces(places, Decimal.ROUND_HALF_UP).toString());
      expect(roundToDecimals(Number(typed), places), typed).toBe(expected);
    }
  });

  it("counts decimal places of short and exponent forms", () => {
    expect([decimalPlaces(3), decimalPlaces(3.4), decimalPlaces(0.001), decimalPlaces(1e-7), decimalPlaces(1.5e3)]).toEqual([0, 1, 3, 7, 0]);
  });
});

describe("pass/fail and choice items", () => {
  const swelling: ChecklistItem = { id: "swelling", label: "No swelling", kind: "pass_fail", severityOnFail: "critical" };
  const rattle: ChecklistItem = {
    id: "rattle",
    label: "Rattle",
    kind: "choice",
    severityOnFail: "major",
    options: [
      { value: "none", label: "None", passes: true },
      { value: "audible", label: "Audible at arm's length", passes: false },
    ],
  };
  it("records pass and fail, with a reason on failure", () => {
    expect(evaluateChecklistItem(swelling, { pass: true })).toEqual({ passed: true, failureReason: null, value: { pass: true } });
    expect(evaluateChecklistItem(swelling, { pass: false }).failureReason).toBe("Marked as failed: No swelling.");
    expect(evaluateChecklistItem(rattle, { choice: "audible" })).toMatchObject({ passed: false, failureReason: "“Audible at arm's length” does not pass: Rattle." });
    expect(evaluateChecklistItem(rattle, { choice: "none" }).passed).toBe(true);
  });
  it("refuses a value of the wrong kind or an unknown choice", () => {
    expect(() => evaluateChecklistItem(swelling, { reading: 1 })).toThrow(/takes pass or fail/);
    expect(() => evaluateChecklistItem(voltage, { pass: true })).toThrow(/takes a reading/);
    expect(() => evaluateChecklistItem(rattle, { choice: "loud" })).toThrow(/not one of the choices/);
  });
});

describe("set aside as suspect (SUS: a for the 2.5 V cut-off, c for the handling)", () => {
  const ocv: Numeric = { ...voltage, suspectBelow: 2.5 };
  it("a reading below the level is suspect, on the rounded value; at the level it only fails", () => {
    expect(suspectReading(ocv, { reading: 2.31 })).toEqual({ reading: "2.31 V", level: "2.50 V" });
    expect(suspectReading(ocv, { reading: 2.495 })).toBeNull(); // rounds to 2.50: not below
    expect(suspectReading(ocv, { reading: 2.5 })).toBeNull();
    expect(reading(ocv, 2.5).passed).toBe(false); // still an ordinary failure (below 3.00 V)
  });
  it("items without a level, other kinds and other values are never suspect", () => {
    expect(suspectReading(voltage, { reading: 0.1 })).toBeNull();
    expect(suspectReading({ id: "swelling", label: "No swelling", kind: "pass_fail", severityOnFail: "critical" }, { pass: false })).toBeNull();
    expect(suspectReading(ocv, { pass: false })).toBeNull();
  });
});
