import { describe, expect, it } from "vitest";
import { galleryHref, parseGallerySearchParams } from "@/lib/gallery/search-params";

const PT = "0b7c5f0e-5b8f-4c52-9a55-3c2f0f1f0a01";

describe("gallery list state in the URL", () => {
  it("keeps every valid filter and drops the ones that do not parse, instead of failing", () => {
    expect(parseGallerySearchParams({ partType: PT, view: "lens", defect: "scratch", kind: "abnormal", grade: "B", status: "draft", cursor: "abc" })).toEqual({
      partType: PT,
      view: "lens",
      defect: "scratch",
      kind: "abnormal",
      grade: "B",
      status: "draft",
      cursor: "abc",
    });
    expect(parseGallerySearchParams({ partType: "not-an-id", grade: "E", kind: ["normal", "abnormal"], view: "", limit: "5" })).toEqual({});
  });

  it("leaves out a part type that is not the workspace's, and the page taken from that filtered list", () => {
    const other = "2f1d7a9c-1e0b-4c7d-8f3a-6b5e4d3c2b1a";
    expect(parseGallerySearchParams({ partType: other, grade: "B", cursor: "p2" }, { partTypeIds: [PT] })).toEqual({ grade: "B" });
    expect(parseGallerySearchParams({ partType: PT, cursor: "p2" }, { partTypeIds: [PT] })).toEqual({ partType: PT, cursor: "p2" });
  });

  it("starts again at page 1 when a filter changes, and keeps the cursor when only the page does", () => {
    const current = { partType: PT, grade: "B" as const, cursor: "p2" };
    expect(galleryHref(current, { grade: "C" })).toBe(`/gallery?partType=${PT}&grade=C`);
    expect(galleryHref(current, { cursor: "p3" })).toBe(`/gallery?partType=${PT}&grade=B&cursor=p3`);
    expect(galleryHref(current, { grade: undefined })).toBe(`/gallery?partType=${PT}`);
  });

  it("clears the view and class when another part type is chosen", () => {
    expect(galleryHref({ partType: PT, view: "lens", defect: "scratch", kind: "normal" }, { partType: undefined })).toBe("/gallery?kind=normal");
    expect(galleryHref({ partType: PT, view: "lens" }, { view: "back" })).toBe(`/gallery?partType=${PT}&view=back`);
  });
});
