import { describe, expect, it } from "vitest";
import { DEFAULT_SPOT_RADIUS_PX, MIN_SPOT_RADIUS } from "@/lib/annotate/constants";
import { setViewport } from "@/lib/annotate/model";
import { dragSteps, drive, makeState, only, withTool } from "../helpers";

const spotState = (scale = 1) => setViewport(withTool(makeState(), "spot"), { scale, offsetX: 0, offsetY: 0 });

describe("Spot tool", () => {
  it("gives a click the default on-screen radius at any zoom", () => {
    expect(only(drive(spotState(), [["click", 50, 60]]).regions)).toEqual({
      id: "t-1",
      role: "defect",
      defect: "scratch",
      shape: { kind: "spot", x: 50, y: 60, radius: DEFAULT_SPOT_RADIUS_PX },
    });
    expect(only(drive(spotState(4), [["click", 50, 60]]).regions)).toMatchObject({ shape: { radius: DEFAULT_SPOT_RADIUS_PX / 4 } });
  });

  it("takes the dragged radius", () => {
    // 3-4-5: dragging from (100, 100) to (130, 140) gives radius 50.
    const s = drive(spotState(), dragSteps(100, 100, 130, 140));
    expect(only(s.regions)).toMatchObject({ shape: { x: 100, y: 100, radius: 50 } });
    expect(s.history.past).toHaveLength(1);
  });

  it("ignores a wobble below the drag threshold and never goes below the minimum radius", () => {
    const wobble = drive(spotState(), [
      ["down", 100, 100],
      ["move", 101, 101],
      ["up", 101, 101],
    ]);
    expect(only(wobble.regions)).toMatchObject({ shape: { radius: DEFAULT_SPOT_RADIUS_PX } });
    const tiny = drive(spotState(32), [["click", 10, 10]]);
    expect(only(tiny.regions)).toMatchObject({ shape: { radius: MIN_SPOT_RADIUS } });
  });

  it("keeps the centre inside the photo and the radius within its cap (10 % of the long edge)", () => {
    const s = drive(spotState(), dragSteps(1200, 400, -5000, 400));
    expect(only(s.regions)).toMatchObject({ shape: { x: 1000, y: 400, radius: 100 } });
  });

  it("cancels with Escape", () => {
    const s = drive(spotState(), [
      ["down", 10, 10],
      ["key", "Escape"],
      ["up", 10, 10],
    ]);
    expect(s.regions).toEqual([]);
  });
});
