import { describe, expect, it } from "vitest";
import { can, describeHolders, holders, isPermission, PERMISSIONS, type Permission } from "@/lib/auth/permissions";
import { ROLES } from "@/lib/auth/roles";

const all = Object.keys(PERMISSIONS) as Permission[];

describe("can", () => {
  it("leads hold every permission", () => {
    expect(all.filter((p) => !can({ roles: ["lead"] }, p))).toEqual([]);
  });
  it("a user holds the union of their roles' permissions, and nothing without a role", () => {
    expect(can({ roles: ["inspector"] }, "recheck.perform")).toBe(false);
    expect(can({ roles: ["inspector", "auditor"] }, "recheck.perform")).toBe(true);
    expect(can({ roles: ["inspector", "auditor"] }, "inspection.read")).toBe(true);
    expect(all.filter((p) => can({ roles: [] }, p))).toEqual([]);
  });
  it("auditors never read a unit's inspection work (a blind recheck must not see the first grade)", () => {
    expect(can({ roles: ["auditor"] }, "inspection.read")).toBe(false);
    expect(holders("inspection.read")).toEqual(["inspector", "trainer", "lead"]);
  });
  it("only leads override grades, decide lots and manage people and leases", () => {
    for (const p of ["grades.override", "lots.decide", "people.manage", "leases.manage"] as const) expect(holders(p)).toEqual(["lead"]);
  });
  it("everyone in the workspace reads its settings and part types", () => {
    expect(holders("workspace.read")).toEqual([...ROLES]);
    expect(holders("part-types.read")).toEqual([...ROLES]);
  });
});

describe("the table", () => {
  it("names permissions area.action and lists roles without leads (they hold all)", () => {
    expect(all.filter((p) => !/^[a-z-]+\.[a-z-]+$/.test(p))).toEqual([]);
    expect(all.filter((p) => (PERMISSIONS[p].roles as readonly string[]).includes("lead"))).toEqual([]);
  });
  it("isPermission knows the table's names only", () => {
    expect(isPermission("lots.read")).toBe(true);
    expect(isPermission("lots.delete")).toBe(false);
    expect(isPermission("toString")).toBe(false);
  });
});

describe("describeHolders", () => {
  it("names the roles a 403 asks for; leads only when nobody else holds it", () => {
    expect(describeHolders("grades.record")).toBe("Inspector");
    expect(describeHolders("lots.read")).toBe("Inspector or Auditor");
    expect(describeHolders("grades.override")).toBe("QC lead");
  });
});
