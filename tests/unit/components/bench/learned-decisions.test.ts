/** What the Bench records for learned ghosts (components/bench/learned-decisions.ts). */
import { describe, expect, it } from "vitest";
import type { GhostShape } from "@/components/annotate/types";
import { ghostCaption } from "@/components/annotate/paint-ghosts";
import { decisionRequests, isLearned } from "@/components/bench/learned-decisions";

const spot = { kind: "spot", x: 10, y: 10, radius: 3 } as const;
const learned = (id: string, modelId: string, defect = "scratch"): GhostShape => ({ id, label: id, role: "defect", defect, shape: spot, learned: { modelId, score: 0.75 } });
const surface: GhostShape = {
  id: "s",
  label: "Surface",
  role: "surface",
  shape: {
    kind: "polygon",
    points: [
      [0, 0],
      [10, 0],
      [10, 10],
    ],
  },
};
const pixel: GhostShape = { id: "p", label: "Pixel", role: "defect", defect: "dead-pixel", shape: { kind: "spot", x: 1, y: 1, radius: 1 } };

describe("decisionRequests", () => {
  it("records only learned ghosts, one request per model, with class, shape and score", () => {
    expect(decisionRequests([surface, learned("a", "m1"), pixel, learned("b", "m2", "stain"), learned("c", "m1")], "dismissed")).toEqual([
      {
        modelId: "m1",
        decisions: [
          { defect: "scratch", shape: spot, score: 0.75, decision: "dismissed" },
          { defect: "scratch", shape: spot, score: 0.75, decision: "dismissed" },
        ],
      },
      { modelId: "m2", decisions: [{ defect: "stain", shape: spot, score: 0.75, decision: "dismissed" }] },
    ]);
  });

  it("asks nothing when no learned ghost is among them", () => {
    expect(decisionRequests([surface, pixel], "accepted")).toEqual([]);
    expect([surface, pixel, learned("a", "m")].map(isLearned)).toEqual([false, false, true]);
  });
});

describe("ghostCaption (the label painted under a ghost)", () => {
  it("names class and score for a learned ghost, and only 'suggested' for the others", () => {
    expect(ghostCaption({ ...learned("a", "m"), label: "Scratch 72 % (learned)" })).toBe("Scratch 72 % (learned)");
    expect([surface, pixel].map(ghostCaption)).toEqual(["suggested", "suggested"]);
  });
});
