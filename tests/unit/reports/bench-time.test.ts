/**
 * Minutes on the bench per unit, from its claim history. The rule is ours (c, stated in
 * lib/reports/bench-time.ts); minutes by hand (HAND).
 */
import { describe, expect, it } from "vitest";
import { benchTime, type BenchEvent } from "@/lib/reports/bench-time";

const at = (time: string) => `2026-06-01T${time}:00Z`;
const claimed = (time: string, userId: string): BenchEvent => ({ at: at(time), kind: "claimed", userId });
const released = (time: string): BenchEvent => ({ at: at(time), kind: "released" });
const graded = (time: string): BenchEvent => ({ at: at(time), kind: "graded" });

describe("benchTime", () => {
  it("sums the sessions from claim to release or grade, leaving out time back in the queue (HAND)", () => {
    // ann 10:00–10:20, back in the queue until 11:00, bo 11:00–11:15.
    expect(benchTime([claimed("10:00", "ann"), released("10:20"), claimed("11:00", "bo"), graded("11:15")])).toEqual({ minutes: 35, byPerson: { ann: 20, bo: 15 }, sessions: 2 });
  });

  it("a lead handing the unit to someone else ends the first session at the hand-over (HAND)", () => {
    expect(benchTime([claimed("10:00", "ann"), claimed("10:30", "bo"), graded("10:40")])).toEqual({ minutes: 40, byPerson: { ann: 30, bo: 10 }, sessions: 2 });
  });

  it("orders the events by time, whatever order they come in, and ignores what follows the first grade", () => {
    const events = [graded("10:45"), claimed("10:00", "ann"), released("10:30"), claimed("10:40", "ann"), claimed("11:00", "bo"), graded("11:30")];
    expect(benchTime(events)).toEqual({ minutes: 35, byPerson: { ann: 35 }, sessions: 2 });
  });

  it("does not guess: a lapsed lease, a grade with no session open, and no grade give null with the reason", () => {
    expect(benchTime([claimed("10:00", "ann"), { at: at("10:40"), kind: "lease_expired" }, claimed("11:00", "bo"), graded("11:10")])).toMatchObject({
      minutes: null,
      unknown: "lease_lapsed",
      byPerson: { bo: 10 },
    });
    expect(benchTime([claimed("10:00", "ann"), released("10:10"), graded("12:00")])).toMatchObject({ minutes: null, unknown: "no_session", byPerson: { ann: 10 } });
    expect(benchTime([claimed("10:00", "ann")])).toMatchObject({ minutes: null, unknown: "not_graded" });
    expect(benchTime([])).toMatchObject({ minutes: null, unknown: "not_graded", sessions: 0 });
  });

  it("refuses a claim without a holder, an unknown event and a bad time", () => {
    expect(() => benchTime([{ at: at("10:00"), kind: "claimed" }])).toThrow(/names who took the unit/);
    expect(() => benchTime([{ at: at("10:00"), kind: "paused" as never }])).toThrow(/Unknown bench event/);
    expect(() => benchTime([{ at: "soon", kind: "released" }])).toThrow(/Not a valid time/);
  });
});
