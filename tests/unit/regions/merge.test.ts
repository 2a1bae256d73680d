/**
 * Three-way merge of region sets. The rule — a side that did not change a region takes the other
 * side's version; a real conflict keeps the local one and is reported — is the usual three-way
 * merge of version control (common practice (c)), applied per region id.
 */
import { describe, expect, it } from "vitest";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { mergeRegionSets } from "@/lib/regions/merge";

const box = (id: string, x: number, defect = "scratch") => ({ id, defect, shape: { kind: "rect" as const, x, y: 10, width: 5, height: 5 } });
const set = (regions: RegionSetPayload["regions"], extra: Partial<RegionSetPayload> = {}): RegionSetPayload => ({ regions, surfaces: [], ruler: null, ...extra });
const ids = (p: RegionSetPayload) => p.regions.map((r) => r.id);

describe("merging region sets", () => {
  const base = set([box("a", 1), box("b", 2), box("c", 3)]);

  it("keeps both sides' additions, mine first", () => {
    const mine = set([...base.regions, box("m1", 10)]);
    const theirs = set([...base.regions, box("t1", 20)]);
    const result = mergeRegionSets({ base, mine, theirs });
    expect(ids(result.payload)).toEqual(["a", "b", "c", "m1", "t1"]);
    expect(result.conflicts).toEqual([]);
    expect(result.takenFromTheirs).toBe(1);
  });

  it("takes their change and deletion of regions I did not touch, keeps mine where only I changed", () => {
    const mine = set([box("a", 100), box("b", 2), box("c", 3)]);
    const theirs = set([box("a", 1), box("b", 200, "dent")]);
    const result = mergeRegionSets({ base, mine, theirs });
    expect(result.payload.regions).toEqual([box("a", 100), box("b", 200, "dent")]);
    expect(result.takenFromTheirs).toBe(2); // b changed, c deleted there
    expect(result.conflicts).toEqual([]);
  });

  it("a region changed differently on both sides keeps mine and says so; changed alike is no conflict", () => {
    const mine = set([box("a", 100), box("b", 5), box("c", 3)]);
    const theirs = set([box("a", 300), box("b", 5), box("c", 3)]);
    const result = mergeRegionSets({ base, mine, theirs });
    expect(result.payload.regions[0]).toEqual(box("a", 100));
    expect(result.conflicts).toEqual(["A Box (scratch) was changed in both sessions; your version is kept."]);
  });

  it("a region I deleted but they changed is kept (evidence never vanishes in a merge); one they deleted but I changed stays too", () => {
    const mine = set([box("b", 22), box("c", 3)]); // deleted a, changed b
    const theirs = set([box("a", 11), box("c", 3)]); // changed a, deleted b
    const result = mergeRegionSets({ base, mine, theirs });
    expect(ids(result.payload).sort()).toEqual(["a", "b", "c"]);
    expect(result.conflicts).toHaveLength(2);
    expect(result.conflicts[1]).toBe("A Box (scratch) you deleted was changed in the other session; it is kept.");
  });

  it("keeps one ruler: mine when both placed a new one, theirs when only they did", () => {
    const r = (id: string, lengthMm: number) => ({ id, a: [0, 0] as [number, number], b: [10, 0] as [number, number], lengthMm });
    const withRuler = set(base.regions, { ruler: r("r0", 5) });
    const both = mergeRegionSets({ base: withRuler, mine: set(base.regions, { ruler: r("r-mine", 6) }), theirs: set(base.regions, { ruler: r("r-theirs", 7) }) });
    expect(both.payload.ruler?.id).toBe("r-mine");
    expect(both.conflicts).toContain("Both sessions placed a Ruler; yours is kept.");
    const onlyTheirs = mergeRegionSets({ base: withRuler, mine: withRuler, theirs: set(base.regions, { ruler: r("r-theirs", 7) }) });
    expect(onlyTheirs.payload.ruler?.id).toBe("r-theirs");
    expect(onlyTheirs.conflicts).toEqual([]);
  });

  it("surfaces merge like regions", () => {
    const s = (id: string, x: number) => ({
      id,
      shape: {
        kind: "polygon" as const,
        points: [
          [x, 0],
          [x + 10, 0],
          [x, 10],
        ] as [number, number][],
      },
    });
    const result = mergeRegionSets({ base: set([], { surfaces: [s("s1", 0)] }), mine: set([], { surfaces: [s("s1", 0), s("s2", 50)] }), theirs: set([], { surfaces: [s("s1", 5)] }) });
    expect(result.payload.surfaces).toEqual([s("s1", 5), s("s2", 50)]);
  });
});
