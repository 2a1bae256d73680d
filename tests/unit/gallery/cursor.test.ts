import { describe, expect, it } from "vitest";
import { decodeGalleryCursor, encodeGalleryCursor, isGalleryCursor } from "@/lib/gallery/cursor";

describe("gallery keyset cursor", () => {
  it("round-trips the microsecond timestamp and id of a page's last item", () => {
    const key = { createdAt: "2026-12-02T23:14:05.123456Z", id: "7e6d5c4b-3a29-4817-a6b5-c4d3e2f1a0b9" };
    const cursor = encodeGalleryCursor(key);
    expect(cursor).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(decodeGalleryCursor(cursor)).toEqual(key);
    expect(isGalleryCursor(cursor)).toBe(true);
  });

  it("refuses anything else with a sentence that says to start again", () => {
    for (const bad of [
      "",
      "not-base64!",
      Buffer.from('{"createdAt":"yesterday","id":"x"}').toString("base64url"),
      Buffer.from('{"createdAt":"2026-12-02T23:14:05Z","id":"7e6d5c4b-3a29-4817-a6b5-c4d3e2f1a0b9","extra":1}').toString("base64url"),
    ]) {
      expect(isGalleryCursor(bad)).toBe(false);
      expect(() => decodeGalleryCursor(bad)).toThrow(/start again from the first page/);
    }
  });
});
