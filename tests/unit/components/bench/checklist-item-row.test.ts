import { describe, expect, it } from "vitest";
import { failureText } from "@/components/bench/checklist-item-row";
import type { ChecklistItem } from "@/lib/part-types/schemas";

const swelling: ChecklistItem = { id: "swelling", label: "No swelling", kind: "pass_fail", severityOnFail: "critical" };
const ocv: ChecklistItem = { id: "ocv", label: "Open-circuit voltage", kind: "numeric", unit: "V", min: 3, max: 4.4, decimals: 2, severityOnFail: "major" };

describe("how a failed checklist result reads", () => {
  it("says a Fail button is the inspector's call, not an automatic verdict", () => {
    // Issue 15: a manual Fail read "Failed automatically — Marked as failed: No swelling."
    const text = failureText(swelling, { failureReason: "Marked as failed: No swelling.", severityOnFail: "critical" });
    expect(text).toBe("Failed (marked by the inspector). Adds a critical functional defect.");
    expect(text).not.toMatch(/automatically/);
  });

  it("keeps 'automatically' for a reading judged against the item's limits", () => {
    expect(failureText(ocv, { failureReason: "2.87 V is below the minimum 3.00 V.", severityOnFail: "major" })).toBe(
      "Failed automatically — 2.87 V is below the minimum 3.00 V. Adds a major functional defect.",
    );
  });
});
