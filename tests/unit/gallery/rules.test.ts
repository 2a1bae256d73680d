import { describe, expect, it } from "vitest";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import {
  compareForReference,
  defectClassesOf,
  GALLERY_MAX_POINTS,
  GALLERY_MAX_REGIONS,
  kindFromRegions,
  publishProblems,
  regionBudgetProblem,
  transitionProblem,
  type ReferenceSortable,
} from "@/lib/gallery/rules";

const scratch = (id: string, x = 10) => ({
  id,
  defect: "scratch",
  shape: {
    kind: "line" as const,
    points: [
      [x, 10],
      [x + 50, 20],
    ] as [number, number][],
    width: 6,
  },
});
const stain = (id: string) => ({ id, defect: "stain", shape: { kind: "spot" as const, x: 40, y: 40, radius: 8 } });
const payload = (regions: RegionSetPayload["regions"] = []): RegionSetPayload => ({ regions, surfaces: [], ruler: null });

describe("status transitions", () => {
  it("publish only a draft; retire a draft or a published item; change nothing retired", () => {
    expect(transitionProblem("draft", "publish")).toBeNull();
    expect(transitionProblem("published", "publish")).toMatch(/already published/);
    expect(transitionProblem("retired", "publish")).toMatch(/retired/);
    expect(transitionProblem("draft", "retire")).toBeNull();
    expect(transitionProblem("published", "retire")).toBeNull();
    expect(transitionProblem("retired", "retire")).toMatch(/retired/);
    expect(transitionProblem("draft", "edit")).toBeNull();
    expect(transitionProblem("published", "edit")).toBeNull();
    expect(transitionProblem("retired", "edit")).toMatch(/can no longer change/);
  });
});

describe("what an item shows", () => {
  it("lists each defect class once, sorted, whatever the order of the regions", () => {
    expect(defectClassesOf(payload([stain("a"), scratch("b"), scratch("c")]))).toEqual(["scratch", "stain"]);
    expect(defectClassesOf(payload())).toEqual([]);
  });

  it("calls a promoted photo abnormal only when its regions show a defect (a Surface alone is normal)", () => {
    expect(kindFromRegions(payload([scratch("a")]))).toBe("abnormal");
    expect(
      kindFromRegions({
        regions: [],
        surfaces: [
          {
            id: "s",
            shape: {
              kind: "polygon",
              points: [
                [0, 0],
                [10, 0],
                [10, 10],
              ],
            },
          },
        ],
        ruler: null,
      }),
    ).toBe("normal");
  });
});

describe("what publishing needs", () => {
  const base = { kind: "abnormal" as const, grade: "B" as const, caption: "Hairline across the lens window: B", regions: payload([scratch("a")]), photoReady: true };

  it("passes a complete abnormal item and a clean normal one", () => {
    expect(publishProblems(base)).toEqual([]);
    expect(publishProblems({ ...base, kind: "normal", grade: "A", regions: payload() })).toEqual([]);
  });

  it("asks for a caption, a ready photo, and regions that fit the kind — every problem at once", () => {
    const problems = publishProblems({ ...base, caption: "   ", photoReady: false, regions: payload() });
    expect(problems).toHaveLength(3);
    expect(problems.join(" ")).toMatch(/not ready/);
    expect(problems.join(" ")).toMatch(/caption/);
    expect(problems.join(" ")).toMatch(/at least one defect region/);
    const normal = publishProblems({ ...base, kind: "normal", grade: "C" });
    expect(normal).toEqual([expect.stringMatching(/nothing to mark/), expect.stringMatching(/grade A, not C/)]);
  });
});

describe("region budget of an item", () => {
  it(`allows ${GALLERY_MAX_REGIONS} regions and refuses one more`, () => {
    const many = Array.from({ length: GALLERY_MAX_REGIONS }, (_, i) => scratch(`r${i}`, i));
    expect(regionBudgetProblem(payload(many))).toBeNull();
    expect(regionBudgetProblem(payload([...many, scratch("extra")]))).toMatch(/at most 100 defect regions \(this one has 101\)/);
  });

  it(`counts points over regions and surfaces (at most ${GALLERY_MAX_POINTS})`, () => {
    const ring = (n: number) => Array.from({ length: n }, (_, k) => [100 + 50 * Math.cos((2 * Math.PI * k) / n), 100 + 50 * Math.sin((2 * Math.PI * k) / n)] as [number, number]);
    const set: RegionSetPayload = {
      regions: [{ id: "o", defect: "stain", shape: { kind: "polygon", points: ring(15_000) } }],
      surfaces: [{ id: "s", shape: { kind: "polygon", points: ring(5_000) } }],
      ruler: null,
    };
    expect(regionBudgetProblem(set)).toBeNull();
    set.surfaces[0].shape.points.push([1, 1]);
    expect(regionBudgetProblem(set)).toMatch(/20000 points in all \(these hold 20001\)/);
  });
});

describe("reference panel order", () => {
  it("puts normal items first, then A → Reject, then the newest, then by id", () => {
    const at = (iso: string) => new Date(iso);
    const items: ReferenceSortable[] = [
      { id: "c", kind: "abnormal", grade: "Reject", createdAt: at("2026-11-03") },
      { id: "b", kind: "abnormal", grade: "B", createdAt: at("2026-11-01") },
      { id: "e", kind: "abnormal", grade: "B", createdAt: at("2026-11-05") },
      { id: "n", kind: "normal", grade: "A", createdAt: at("2026-10-01") },
      { id: "a", kind: "abnormal", grade: "C", createdAt: at("2026-11-05") },
      { id: "d", kind: "abnormal", grade: "B", createdAt: at("2026-11-05") },
    ];
    expect([...items].sort(compareForReference).map((i) => i.id)).toEqual(["n", "d", "e", "b", "a", "c"]);
  });
});
