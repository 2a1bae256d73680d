import { describe, expect, it } from "vitest";
import { missingRequiredViews, suggestViews } from "@/lib/photos/views";

const views = [
  { key: "front", label: "Front", required: true },
  { key: "back", label: "Back", required: true },
  { key: "lens", label: "Lens", required: false },
];

describe("view suggestions for new files", () => {
  it("fill the required views first, then optional ones, then cycle", () => {
    expect(suggestViews(views, new Set(), 5)).toEqual(["front", "back", "lens", "front", "back"]);
  });

  it("skip views that already have a photo until every view has one", () => {
    expect(suggestViews(views, new Set(["front"]), 3)).toEqual(["back", "lens", "front"]);
    expect(missingRequiredViews(views, new Set(["front", "lens"])).map((v) => v.key)).toEqual(["back"]);
  });

  it("suggest nothing for a part type without views", () => {
    expect(suggestViews([], new Set(), 2)).toEqual([]);
  });
});
