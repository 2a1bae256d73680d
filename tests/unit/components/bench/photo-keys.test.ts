import { describe, expect, it } from "vitest";
import { photoStepForKey, steppedPhotoId } from "@/components/bench/photo-keys";

const key = (k: string, mods: Partial<{ shift: boolean; alt: boolean; mod: boolean }> = {}) => ({ key: k, shift: false, alt: false, mod: false, ...mods });

describe("photo keys", () => {
  it("reads PageDown/. as next and PageUp/, as previous, leaving modified keys to the browser", () => {
    expect(photoStepForKey(key("PageDown"))).toBe(1);
    expect(photoStepForKey(key("."))).toBe(1);
    expect(photoStepForKey(key("PageUp"))).toBe(-1);
    expect(photoStepForKey(key(","))).toBe(-1);
    expect(photoStepForKey(key("PageDown", { mod: true }))).toBeNull(); // Ctrl+PageDown: the browser's next tab
    expect(photoStepForKey(key("b"))).toBeNull();
  });

  it("steps along the photos and wraps round at the ends", () => {
    const ids = ["a", "b", "c"];
    expect(steppedPhotoId(ids, "a", 1)).toBe("b");
    expect(steppedPhotoId(ids, "c", 1)).toBe("a");
    expect(steppedPhotoId(ids, "a", -1)).toBe("c");
    expect(steppedPhotoId(ids, null, 1)).toBe("a");
    expect(steppedPhotoId(ids, "gone", -1)).toBe("c");
    expect(steppedPhotoId([], "a", 1)).toBeNull();
  });
});
