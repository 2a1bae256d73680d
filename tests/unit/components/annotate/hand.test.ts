import { describe, expect, it } from "vitest";
import { handChanged } from "@/components/annotate/hand";
import { makeState, withTool } from "../../annotate/helpers";

describe("the hand a canvas reports in the event itself", () => {
  it("is the new tool and class when either changed, else nothing", () => {
    const box = { ...withTool(makeState(), "box"), activeDefect: "scratch" };
    expect(handChanged(box, { ...box, activeTool: "spot" })).toEqual({ tool: "spot", defect: "scratch" });
    expect(handChanged(box, { ...box, activeDefect: "dent" })).toEqual({ tool: "box", defect: "dent" });
    expect(handChanged(box, { ...box, regions: [] })).toBeNull();
  });
});
