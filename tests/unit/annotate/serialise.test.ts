import { describe, expect, it } from "vitest";
import { createAnnotationState, setRulerLength } from "@/lib/annotate/model";
import { regionsFromPayload, toRegionSetPayload } from "@/lib/annotate/serialise";
import { parseRegionSet } from "@/lib/geometry/validate";
import { DEFECTS, dragSteps, drive, makeState, withTool } from "./helpers";

describe("region-set payload", () => {
  it("serialises drawn regions into a payload the save schema accepts, and loads it back", () => {
    let s = makeState();
    s = drive(withTool(s, "surface"), [
      ["click", 0, 0],
      ["click", 900, 0],
      ["click", 900, 700],
      ["key", "Enter"],
    ]);
    s = drive(withTool(s, "box"), dragSteps(10, 10, 60, 60));
    s = drive(withTool(s, "line"), [
      ["click", 100, 100],
      ["dblclick", 300, 120],
    ]);
    s = drive(withTool(s, "spot"), [["click", 500, 500]]);
    s = drive(withTool(s, "outline"), [
      ["click", 600, 600],
      ["click", 700, 600],
      ["click", 650, 700],
      ["key", "Enter"],
    ]);
    s = setRulerLength(drive(withTool(s, "ruler"), dragSteps(10, 790, 310, 790)), 30);

    const payload = toRegionSetPayload(s);
    expect(payload.regions.map((r) => r.shape.kind)).toEqual(["rect", "line", "spot", "polygon"]);
    expect(payload.surfaces).toHaveLength(1);
    expect(payload.ruler).toMatchObject({ a: [10, 790], b: [310, 790], lengthMm: 30 });

    // Through JSON, as it travels to the server.
    const parsed = parseRegionSet(JSON.parse(JSON.stringify(payload)), { width: 1000, height: 800, allowedDefects: DEFECTS });
    expect(parsed).toEqual({ ok: true, value: payload });

    const reloaded = createAnnotationState({ image: s.image, allowedDefects: DEFECTS, idPrefix: "u", regions: regionsFromPayload(payload) });
    expect(toRegionSetPayload(reloaded)).toEqual(payload);
    expect(reloaded.regions[0].role).toBe("surface");
  });
});
