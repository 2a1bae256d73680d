import { describe, expect, it } from "vitest";
import { DEFECT_SEVERITIES, DEFECT_SEVERITIES_MILDEST_FIRST, DEFECT_SEVERITY_LABELS, severityRank } from "@/lib/part-types/severity";
import { benchClassOrder } from "@/lib/annotate/class-order";

describe("defect severities", () => {
  it("are the three nonconformity classes, worst first", () => {
    // (b) from memory: ISO 2859-1 grades nonconformities by seriousness; critical > major > minor
    // is the trade's usual three-class split (c) common practice.
    expect(DEFECT_SEVERITIES).toEqual(["critical", "major", "minor"]);
    expect(DEFECT_SEVERITIES.map(severityRank)).toEqual([0, 1, 2]);
  });

  it("run mildest first on the Bench, the same list reversed", () => {
    expect(DEFECT_SEVERITIES_MILDEST_FIRST).toEqual([...DEFECT_SEVERITIES].reverse());
    const classes = [
      { key: "crack", severity: "critical" as const },
      { key: "dent", severity: "minor" as const },
      { key: "scratch", severity: "major" as const },
    ];
    expect(benchClassOrder(classes).map((c) => c.key)).toEqual(["dent", "scratch", "crack"]);
  });

  it("have a label for each class", () => {
    expect(DEFECT_SEVERITIES.map((s) => DEFECT_SEVERITY_LABELS[s])).toEqual(["Critical", "Major", "Minor"]);
  });
});
