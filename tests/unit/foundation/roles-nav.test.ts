import { describe, expect, it } from "vitest";
import { hasAnyRole } from "@/lib/auth/roles";
import { screensFor } from "@/lib/nav";

describe("hasAnyRole", () => {
  it("passes a user holding one of the wanted roles", () => {
    expect(hasAnyRole(["inspector", "auditor"], ["auditor"])).toBe(true);
    expect(hasAnyRole(["inspector"], "trainer")).toBe(false);
  });
  it("lets leads through every check", () => {
    expect(hasAnyRole(["lead"], "inspector")).toBe(true);
    expect(hasAnyRole(["lead"], ["trainer", "auditor"])).toBe(true);
  });
  it("with no role wanted, any signed-in user passes", () => {
    expect(hasAnyRole(["trainer"], undefined)).toBe(true);
    expect(hasAnyRole(["trainer"], [])).toBe(true);
  });
});

describe("screensFor", () => {
  const labels = (roles: Parameters<typeof screensFor>[0], outbox = false) => screensFor(roles, { outbox }).map((s) => s.label);
  it("shows each role only its screens", () => {
    expect(labels(["inspector"])).toEqual(["Queue", "Lots", "Gallery", "Calibration", "Part types"]);
    expect(labels(["trainer"])).toEqual(["Gallery", "Calibration", "Rubrics", "Part types"]);
    expect(labels(["auditor"])).toEqual(["Lots", "Gallery", "Recheck", "Rubrics", "Suppliers", "Part types", "Reports"]);
  });
  it("gives several roles the union, in navigation order", () => {
    expect(labels(["trainer", "auditor"])).toEqual(["Lots", "Gallery", "Calibration", "Recheck", "Rubrics", "Suppliers", "Part types", "Reports"]);
  });
  it("shows the Outbox only to leads and only while the local inbox is in use", () => {
    expect(labels(["lead"], true)).toContain("Outbox");
    expect(labels(["lead"], false)).not.toContain("Outbox");
    expect(labels(["auditor"], true)).not.toContain("Outbox");
    expect(labels(["lead"], true)).toContain("People");
  });
});
