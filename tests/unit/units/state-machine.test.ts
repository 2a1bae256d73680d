import { describe, expect, it } from "vitest";
import { UNIT_STATUSES } from "@/db/schema/lots";
import { AppError } from "@/lib/errors";
import { eventsFrom, transition } from "@/lib/units/state-machine";

describe("unit state machine", () => {
  it("follows the inspection path queued → on bench → graded → in recheck → final", () => {
    let s = transition("queued", "claim");
    expect(s).toBe("on_bench");
    s = transition(s, "submit_grade");
    expect(s).toBe("graded");
    s = transition(s, "start_recheck");
    expect(s).toBe("in_recheck");
    expect(transition(s, "finalise")).toBe("final");
  });

  it("lets a unit go back to the queue from the bench, and a lead reopen a graded one", () => {
    expect(transition("on_bench", "release")).toBe("queued");
    expect(transition("graded", "reopen")).toBe("queued");
  });

  it("refuses impossible moves with a 409 that says why", () => {
    const attempt = () => transition("final", "claim");
    expect(attempt).toThrow(AppError);
    expect(attempt).toThrow("This unit is final, so it cannot be taken onto the bench.");
    try {
      transition("queued", "submit_grade");
    } catch (err) {
      expect((err as AppError).status).toBe(409);
    }
  });

  it("a unit not yet graded when its lot is decided is withdrawn, from the queue or the bench, for good", () => {
    expect(transition("queued", "withdraw")).toBe("not_graded");
    expect(transition("on_bench", "withdraw")).toBe("not_graded");
    expect(() => transition("graded", "withdraw")).toThrow("This unit is graded, so it cannot be withdrawn from the queue.");
    expect(() => transition("not_graded", "claim")).toThrow("cannot be taken onto the bench");
  });

  it("final and not inspected are terminal and every other status has a way forward", () => {
    const terminal = ["final", "not_graded"];
    for (const status of terminal) expect(eventsFrom(status as (typeof UNIT_STATUSES)[number])).toEqual([]);
    for (const status of UNIT_STATUSES.filter((s) => !terminal.includes(s))) expect(eventsFrom(status).length).toBeGreaterThan(0);
  });
});
