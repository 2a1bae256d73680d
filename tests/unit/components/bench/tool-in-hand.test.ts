import { describe, expect, it } from "vitest";
import { handAfterKey } from "@/components/bench/tool-in-hand";

const key = (k: string) => ({ key: k, shift: false, alt: false, mod: false });
const classes = ["dent", "scratch", "crack"];

describe("the tool in hand between two photos", () => {
  it("takes tool letters and class numbers as a canvas would", () => {
    expect(handAfterKey({ tool: "select", defect: "dent" }, classes, key("b"))).toEqual({ tool: "box", defect: "dent" });
    expect(handAfterKey({ tool: "box", defect: "dent" }, classes, key("3"))).toEqual({ tool: "box", defect: "crack" });
    expect(handAfterKey({ tool: "box", defect: "dent" }, classes, key("f"))).toEqual({ tool: "surface", defect: "dent" });
  });

  it("ignores keys that change nothing, and drawing tools without a class", () => {
    expect(handAfterKey({ tool: "box", defect: "dent" }, classes, key("b"))).toBeNull();
    expect(handAfterKey({ tool: "select", defect: "dent" }, classes, key("x"))).toBeNull();
    expect(handAfterKey({ tool: "select", defect: null }, classes, key("b"))).toBeNull();
  });
});
