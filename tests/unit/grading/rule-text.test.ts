/** Number formatting of explanation lines (our own wording spec: percent 1–2 decimals, mm 1 decimal). */
import { describe, expect, it } from "vitest";
import { formatPair, formatValue } from "@/lib/grading/rule-text";

describe("formatValue", () => {
  it("prints percent with 1–2 decimals and keeps tiny shares visible", () => {
    expect(formatValue("percent", 0.8)).toBe("0.8 %");
    expect(formatValue("percent", 0.75)).toBe("0.75 %");
    expect(formatValue("percent", 0.754)).toBe("0.75 %");
    expect(formatValue("percent", 12)).toBe("12.0 %");
    expect(formatValue("percent", 0)).toBe("0.0 %");
    expect(formatValue("percent", 0.004)).toBe("0.004 %");
  });

  it("prints mm and mm² with 1 decimal, small values with 2", () => {
    expect(formatValue("mm", 4.24)).toBe("4.2 mm");
    expect(formatValue("mm", 3)).toBe("3.0 mm");
    expect(formatValue("mm2", 0.04)).toBe("0.04 mm²");
    expect(formatValue("count", 3)).toBe("3");
    expect(formatValue("class", "beyond")).toBe("beyond class IV");
  });

  it("adds decimals until a value and its threshold print differently", () => {
    expect(formatPair("mm", 3.04, 3)).toEqual(["3.04 mm", "3.0 mm"]);
    expect(formatPair("mm", 3.0412, 3)).toEqual(["3.04 mm", "3.0 mm"]); // only as many decimals as needed
    expect(formatPair("percent", 0.50049, 0.5)).toEqual(["0.5005 %", "0.5 %"]);
    expect(formatPair("percent", 0.5, 0.5)).toEqual(["0.5 %", "0.5 %"]);
  });
});
