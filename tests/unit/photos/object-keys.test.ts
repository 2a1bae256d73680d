import { describe, expect, it } from "vitest";
import { originalKey, parsePhotoKey, previewKey, stagingKey, thumbnailKey, unitPhotosPrefix } from "@/lib/photos/object-keys";

const owner = { workspaceId: "0b7c5f0e-5b8f-4c52-9a55-3c2f0f1f0a01", unitId: "2f1d7a9c-1e0b-4c7d-8f3a-6b5e4d3c2b1a", photoId: "7e6d5c4b-3a29-4817-a6b5-c4d3e2f1a0b9" };

describe("object keys", () => {
  it("are built from ids only and parse back to their owner and kind", () => {
    expect(stagingKey(owner)).toBe(`uploads/${owner.workspaceId}/${owner.unitId}/${owner.photoId}`);
    expect(originalKey(owner)).toBe(`photos/${owner.workspaceId}/${owner.unitId}/${owner.photoId}/original`);
    expect(unitPhotosPrefix(owner)).toBe(`photos/${owner.workspaceId}/${owner.unitId}/`);
    for (const [key, kind] of [
      [stagingKey(owner), "staging"],
      [originalKey(owner), "original"],
      [previewKey(owner), "preview"],
      [thumbnailKey(owner), "thumbnail"],
    ] as const) {
      expect(parsePhotoKey(key)).toEqual({ ...owner, kind });
    }
  });

  it("put a gallery upload (no unit) under gallery/ and parse it back with a null unit", () => {
    const gallery = { ...owner, unitId: null };
    expect(stagingKey(gallery)).toBe(`uploads/${owner.workspaceId}/gallery/${owner.photoId}`);
    expect(originalKey(gallery)).toBe(`photos/${owner.workspaceId}/gallery/${owner.photoId}/original`);
    expect(parsePhotoKey(originalKey(gallery))).toEqual({ ...gallery, kind: "original" });
    expect(parsePhotoKey(thumbnailKey(gallery))).toEqual({ ...gallery, kind: "thumbnail" });
    expect(parsePhotoKey(stagingKey(gallery))).toEqual({ ...gallery, kind: "staging" });
    expect(parsePhotoKey(`photos/${owner.workspaceId}/Gallery/${owner.photoId}/original`)).toBeNull();
  });

  it("refuse anything but lower-case UUIDs, so no text a person typed can reach a key", () => {
    expect(() => originalKey({ ...owner, photoId: "../../etc/passwd" })).toThrow(/UUID/);
    expect(() => stagingKey({ ...owner, unitId: owner.unitId.toUpperCase() })).toThrow(/UUID/);
    expect(() => stagingKey({ ...owner, unitId: "gallery" })).toThrow(/UUID/);
  });

  it("do not recognise keys this app never writes", () => {
    expect(parsePhotoKey(`photos/${owner.workspaceId}/${owner.unitId}/${owner.photoId}/original.jpg`)).toBeNull();
    expect(parsePhotoKey(`photos/${owner.workspaceId}/${owner.unitId}/../original`)).toBeNull();
    expect(parsePhotoKey(`fixtures/${owner.photoId}/original.jpg`)).toBeNull();
    expect(parsePhotoKey(`uploads/${owner.workspaceId}/${owner.unitId}`)).toBeNull();
  });
});
