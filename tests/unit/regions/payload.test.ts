/**
 * Region rows ↔ payload: order, provenance of unchanged regions, canonical comparison.
 * Plain bookkeeping (no outside source needed); the jsonb key reordering that canonicalJson
 * guards against is PostgreSQL's documented jsonb behaviour ("does not preserve the order of
 * object keys", PostgreSQL 15 manual §8.14) (a).
 */
import { describe, expect, it } from "vitest";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { canonicalJson, contentsOfPayload, payloadFromRows, rowsForSave, samePayload, type StoredRegion } from "@/lib/regions/payload";

const payload: RegionSetPayload = {
  surfaces: [
    {
      id: "s1",
      shape: {
        kind: "polygon",
        points: [
          [0, 0],
          [100, 0],
          [100, 80],
        ],
      },
    },
  ],
  regions: [
    {
      id: "a-2",
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [1, 1],
          [50, 40],
        ],
        width: 3,
      },
    },
    { id: "a-10", defect: "dent", shape: { kind: "rect", x: 5, y: 6, width: 7, height: 8 } },
    { id: "a-1", defect: "dent", shape: { kind: "spot", x: 20, y: 30, radius: 4 } },
  ],
  ruler: { id: "r1", a: [0, 0], b: [100, 0], lengthMm: 25 },
};

describe("rows for a save", () => {
  it("keeps drawing order in position (surfaces, defects in payload order, ruler) and loads back the same payload", () => {
    const { rows, added, changed, removed } = rowsForSave(payload, [], { authorId: "u1", version: 1 });
    expect(rows.map((r) => [r.clientId, r.position])).toEqual([
      ["s1", 0],
      ["a-2", 1],
      ["a-10", 2],
      ["a-1", 3],
      ["r1", 4],
    ]);
    expect({ added, changed, removed }).toEqual({ added: 5, changed: 0, removed: 0 });
    // Rows come back from the database in any order; ids sort "a-1" < "a-10" < "a-2", so order by id would be wrong.
    const shuffled = [rows[3], rows[0], rows[4], rows[2], rows[1]];
    expect(payloadFromRows(shuffled)).toEqual(payload);
  });

  it("an unchanged region keeps its author and version; changed and new ones get the saver's", () => {
    const first = rowsForSave(payload, [], { authorId: "ann", version: 1 }).rows;
    const next: RegionSetPayload = {
      ...payload,
      regions: [payload.regions[0], { ...payload.regions[1], defect: "scratch" }, { id: "b-1", defect: "dent", shape: { kind: "spot", x: 1, y: 1, radius: 1 } }],
    };
    const second = rowsForSave(next, first, { authorId: "bo", version: 2 });
    const byId = new Map(second.rows.map((r) => [r.clientId, r]));
    expect([byId.get("a-2")!.authorId, byId.get("a-2")!.versionWritten]).toEqual(["ann", 1]);
    expect([byId.get("a-10")!.authorId, byId.get("a-10")!.versionWritten]).toEqual(["bo", 2]);
    expect([byId.get("b-1")!.authorId, byId.get("b-1")!.versionWritten]).toEqual(["bo", 2]);
    expect({ added: second.added, changed: second.changed, removed: second.removed }).toEqual({ added: 1, changed: 1, removed: 1 });
  });

  it("compares content regardless of key order (as jsonb returns it)", () => {
    const stored = rowsForSave(payload, [], { authorId: "ann", version: 1 }).rows;
    // jsonb reorders keys by length, then bytes: {"x":…,"y":…,"kind":…} — same value.
    const reordered: StoredRegion[] = stored.map((r) => (r.shape?.kind === "rect" ? { ...r, shape: JSON.parse('{"x":5,"y":6,"kind":"rect","width":7,"height":8}') } : r));
    const again = rowsForSave(payload, reordered, { authorId: "bo", version: 2 });
    expect(again.changed).toBe(0);
    expect(again.rows.every((r) => r.authorId === "ann")).toBe(true);
  });
});

describe("canonical comparison", () => {
  it("treats key order as irrelevant and everything else as relevant", () => {
    expect(canonicalJson({ b: 1, a: [1, { d: 2, c: 3 }] })).toBe('{"a":[1,{"c":3,"d":2}],"b":1}');
    expect(samePayload(payload, JSON.parse(JSON.stringify(payload)))).toBe(true);
    expect(samePayload(payload, { ...payload, regions: [...payload.regions].reverse() })).toBe(false);
    expect(samePayload(payload, { ...payload, ruler: null })).toBe(false);
  });

  it("lists contents with the ruler last", () => {
    expect(contentsOfPayload(payload).map((c) => c.role)).toEqual(["surface", "defect", "defect", "defect", "ruler"]);
  });
});
