import { describe, expect, it } from "vitest";
import { classLooks, defectStyleMap, fnv1a, hashedLook, USUAL_CLASS_LOOKS } from "@/lib/annotate/class-looks";
import { patternKey } from "@/lib/annotate/defect-styles";
import { benchClassOrder } from "@/lib/annotate/class-order";
import { EXAMPLE_PART_TYPES } from "@/lib/grading/example-part-types";

const partTypes = Object.entries(EXAMPLE_PART_TYPES).map(([slug, p]) => ({ slug, keys: p.defects, severities: p.defectSeverities }));
const lookOf = (style: { colour: string } & Parameters<typeof patternKey>[0]) => `${style.colour}|${patternKey(style)}`;

describe("a class keeps one look everywhere", () => {
  it("gives Scratch (and every usual class) the same look on every part type, in any list position", () => {
    // Issue 15: Scratch was orange on cameras and yellow-dotted on batteries (the style followed the key number).
    const seen = new Map<string, string>();
    for (const { slug, keys, severities } of partTypes) {
      for (const order of [keys, [...keys].reverse(), benchClassOrder(keys.map((key) => ({ key, severity: severities[key] }))).map((c) => c.key)]) {
        for (const [key, style] of defectStyleMap(order)) {
          const look = lookOf(style);
          expect(seen.get(key) ?? look, `${key} on ${slug}`).toBe(look);
          seen.set(key, look);
        }
      }
    }
    expect(seen.size).toBe(Object.keys(USUAL_CLASS_LOOKS).length);
  });

  it("tells every class of each example part type apart by pattern, and by colour and dash where it has nine or fewer", () => {
    for (const { slug, keys } of partTypes) {
      const styles = [...defectStyleMap(keys).values()];
      expect(styles, slug).toHaveLength(keys.length);
      expect(new Set(styles.map(patternKey)).size, `${slug}: patterns`).toBe(keys.length);
      if (keys.length <= 9) {
        expect(new Set(styles.map((s) => s.colour)).size, `${slug}: colours`).toBe(keys.length);
        expect(new Set(styles.map((s) => s.stroke.dash.join(","))).size, `${slug}: dashes (Line regions)`).toBe(keys.length);
      }
    }
  });

  it("gives no two usual classes the same look", () => {
    const looks = Object.keys(USUAL_CLASS_LOOKS).map((key) => lookOf(defectStyleMap([key]).get(key)!));
    expect(new Set(looks).size).toBe(looks.length);
  });
});

describe("a workspace's own classes", () => {
  it("take a look from the key alone, the same on every part type", () => {
    const a = defectStyleMap(["scratch", "lens-haze", "dent"]).get("lens-haze")!;
    const b = defectStyleMap(["lens-haze"]).get("lens-haze")!;
    expect(lookOf(a)).toBe(lookOf(b));
  });

  it("never borrow a usual class's look", () => {
    const usual = new Set(Object.keys(USUAL_CLASS_LOOKS).map((key) => lookOf(defectStyleMap([key]).get(key)!)));
    const custom = Array.from({ length: 300 }, (_, i) => `custom-${i}`);
    for (const style of defectStyleMap(custom).values()) expect(usual.has(lookOf(style))).toBe(false);
  });

  it("step to the next free look when two keys of one part type hash to the same look; the first in key order keeps its own", () => {
    // Find two keys whose hashes land on the same look (a fixed search, so the test is deterministic).
    const byLook = new Map<string, string>();
    let pair: [string, string] | null = null;
    for (let i = 0; !pair && i < 100_000; i++) {
      const key = `k${i}`;
      const look = JSON.stringify(hashedLook(key));
      const other = byLook.get(look);
      if (other && !Object.values(USUAL_CLASS_LOOKS).some((u) => JSON.stringify(u) === look)) pair = [other, key];
      else byLook.set(look, key);
    }
    expect(pair).not.toBeNull();
    const [first, second] = [...pair!].sort();
    const looks = classLooks([second, first]);
    expect(looks.get(first)).toEqual(hashedLook(first));
    expect(looks.get(second)).not.toEqual(looks.get(first));
  });

  it("hash with 32-bit FNV-1a (offset basis 2166136261, prime 16777619; the published FNV-1a test vectors, (b) from memory)", () => {
    expect(fnv1a("")).toBe(0x811c9dc5);
    expect(fnv1a("a")).toBe(0xe40c292c);
    expect(fnv1a("foobar")).toBe(0xbf9cf968);
  });
});
