/** Who may change a unit now, and the sentence when not (lib/units/editability.ts): one table of cases. */
import { describe, expect, it } from "vitest";
import type { Role } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { assertUnitEditable, leaseRunningAt, unitEditability, type UnitLeaseState, type UnitWork } from "@/lib/units/editability";

const inspector = { id: "me", roles: ["inspector"] as Role[] };
const lead = { id: "lead", roles: ["lead"] as Role[] };
const auditor = { id: "aud", roles: ["auditor"] as Role[] };
const trainer = { id: "tr", roles: ["trainer"] as Role[] };

const waiting: UnitLeaseState = { status: "queued", leaseHolderId: null, leaseHolderName: null, leaseExpiresAt: null, leaseRunning: false };
const mine: UnitLeaseState = { status: "on_bench", leaseHolderId: "me", leaseHolderName: "Me", leaseExpiresAt: "2026-12-02T10:20:00Z", leaseRunning: true };
const heldByInes: UnitLeaseState = { status: "on_bench", leaseHolderId: "ines", leaseHolderName: "Ines", leaseExpiresAt: "2026-12-02T10:20:00Z", leaseRunning: true };
const inesRanOut: UnitLeaseState = { ...heldByInes, leaseExpiresAt: "2026-12-02T09:00:00Z", leaseRunning: false };
const mineRanOut: UnitLeaseState = { ...mine, leaseRunning: false };
const graded: UnitLeaseState = { ...waiting, status: "graded" };
const withdrawn: UnitLeaseState = { ...waiting, status: "not_graded" };

type Case = [string, UnitWork, { id: string; roles: Role[] }, UnitLeaseState, "open" | "decided", string];
/** Expected: "claims" / "edits" (allowed, with or without taking the unit) or the refusal's cause. */
const CASES: Case[] = [
  ["an inspector on a waiting unit takes it", "regions", inspector, waiting, "open", "claims"],
  ["an inspector on their own running lease", "regions", inspector, mine, "open", "edits"],
  ["an inspector whose own lease ran out takes it again", "regions", inspector, mineRanOut, "open", "claims"],
  ["someone else's running lease holds an inspector", "regions", inspector, heldByInes, "open", "held"],
  ["someone else's running lease holds a lead's regions", "regions", lead, heldByInes, "open", "held"],
  ["someone else's running lease holds a lead's photo changes", "photos", lead, heldByInes, "open", "held"],
  ["someone else's running lease holds a lead's grade", "grade", lead, heldByInes, "open", "held"],
  ["a lead corrects the checklist on someone else's bench", "checklist", lead, heldByInes, "open", "edits"],
  ["a lead corrects the serial on someone else's bench", "serial", lead, heldByInes, "open", "edits"],
  ["an inspector's checklist is held by someone else's lease", "checklist", inspector, heldByInes, "open", "held"],
  ["an expired lease frees the unit: an inspector's checklist takes it", "checklist", inspector, inesRanOut, "open", "claims"],
  ["a lead's checklist correction leaves an expired bench alone", "checklist", lead, inesRanOut, "open", "edits"],
  ["a lead's checklist takes a waiting unit", "checklist", lead, waiting, "open", "claims"],
  ["a serial never takes the unit", "serial", inspector, waiting, "open", "edits"],
  ["an upload is not held by a lease and never takes the unit", "upload", inspector, heldByInes, "open", "edits"],
  ["grading does not claim (finishing the inspection moves the unit)", "grade", inspector, waiting, "open", "edits"],
  ["a decided lot closes everything", "checklist", lead, waiting, "decided", "lot"],
  ["a decided lot closes uploads", "upload", inspector, waiting, "decided", "lot"],
  ["a graded unit's regions are the record", "regions", lead, graded, "open", "status"],
  ["a withdrawn unit takes no photos", "upload", inspector, withdrawn, "open", "status"],
  ["auditors never change a unit", "regions", auditor, waiting, "open", "permission"],
  ["trainers do not record checklists", "checklist", trainer, waiting, "open", "permission"],
  ["permission is checked before the lot", "photos", auditor, graded, "decided", "permission"],
];

describe("unitEditability", () => {
  it.each(CASES)("%s", (_name, work, actor, unit, lotStatus, expected) => {
    const result = unitEditability({ work, actor, lotStatus, unit, timeZone: "UTC" });
    const got = result.editable ? (result.claims ? "claims" : "edits") : result.cause;
    expect(got).toBe(expected);
  });

  it("says why, in the sentence the 409/403 and the Bench's banner both show", () => {
    const say = (work: UnitWork, actor: typeof inspector, unit: UnitLeaseState, lotStatus: "open" | "decided" = "open") => {
      const r = unitEditability({ work, actor, lotStatus, unit, timeZone: "UTC" });
      return r.editable ? null : [r.code, r.reason];
    };
    expect(say("regions", inspector, heldByInes)).toEqual(["conflict", "Ines has this unit on their bench (lease until 10:20), so it is read-only for you."]);
    expect(say("regions", inspector, graded)).toEqual(["conflict", "This unit is graded, so its regions are part of the record and can no longer change."]);
    expect(say("checklist", inspector, waiting, "decided")).toEqual(["conflict", "This unit's lot is decided; its checklist is part of the record and can no longer change."]);
    expect(say("upload", inspector, graded)).toEqual(["conflict", "This unit is graded, so its photos are part of the record and no more can be added."]);
    expect(say("regions", auditor, waiting)).toEqual(["forbidden", "Marking regions needs the Inspector role, which your account does not have."]);
  });

  it("names the lease's end in the workspace's time zone, and a holder without a name", () => {
    const r = unitEditability({ work: "photos", actor: inspector, lotStatus: "open", unit: { ...heldByInes, leaseHolderName: null }, timeZone: "Europe/Berlin" });
    expect(r.editable ? null : r.reason).toBe("Another inspector has this unit on their bench (lease until 11:20), so it is read-only for you.");
  });
});

describe("assertUnitEditable", () => {
  it("throws the refusal as an AppError with its status", () => {
    const refusal = (() => {
      try {
        assertUnitEditable({ work: "regions", actor: auditor, lotStatus: "open", unit: waiting });
      } catch (err) {
        return err;
      }
    })();
    expect(refusal).toBeInstanceOf(AppError);
    expect((refusal as AppError).status).toBe(403);
    expect(() => assertUnitEditable({ work: "regions", actor: inspector, lotStatus: "open", unit: heldByInes })).toThrow(/read-only for you/);
    expect(assertUnitEditable({ work: "regions", actor: inspector, lotStatus: "open", unit: waiting })).toEqual({ claims: true });
  });
});

describe("leaseRunningAt (the Bench's clock)", () => {
  const now = new Date("2026-12-02T10:00:00Z");
  it("runs on a bench until the lease's end, never for a waiting unit", () => {
    expect(leaseRunningAt({ status: "on_bench", leaseExpiresAt: "2026-12-02T10:00:01Z" }, now)).toBe(true);
    expect(leaseRunningAt({ status: "on_bench", leaseExpiresAt: "2026-12-02T10:00:00Z" }, now)).toBe(false);
    expect(leaseRunningAt({ status: "queued", leaseExpiresAt: "2026-12-02T11:00:00Z" }, now)).toBe(false);
    expect(leaseRunningAt({ status: "on_bench", leaseExpiresAt: null }, now)).toBe(false);
  });
});
