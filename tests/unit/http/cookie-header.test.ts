import { describe, expect, it } from "vitest";
import { cookieJarFromHeader } from "@/lib/http/cookie-header";

// The rules are next/headers' own (its cookie parser, @edge-runtime/cookies); the plain Node routes
// must read a session cookie exactly as the App Router handlers do. Cases written out by hand.
describe("cookieJarFromHeader", () => {
  it("reads name=value pairs split at '; ' and URL-decodes the values", () => {
    const jar = cookieJarFromHeader("a=1; next-auth.session-token=eyJ.x-y_z; b=%E2%9C%93%20ok");
    expect(jar.get("a")).toBe("1");
    expect(jar.get("next-auth.session-token")).toBe("eyJ.x-y_z");
    expect(jar.get("b")).toBe("✓ ok");
    expect(jar.names()).toEqual(["a", "next-auth.session-token", "b"]);
  });

  it("keeps '=' inside a value, splits without the space too, and lets the last of two same names win", () => {
    const jar = cookieJarFromHeader("t=abc==;u=2; t=def=");
    expect(jar.get("t")).toBe("def=");
    expect(jar.get("u")).toBe("2");
  });

  it("counts a bare name as 'true' and skips a value that does not decode", () => {
    const jar = cookieJarFromHeader("flag; bad=%E0%A4%A; ok=1");
    expect(jar.get("flag")).toBe("true");
    expect(jar.get("bad")).toBeUndefined();
    expect(jar.get("ok")).toBe("1");
  });

  it("is empty without a header, and joins a header sent twice", () => {
    expect(cookieJarFromHeader(undefined).names()).toEqual([]);
    expect(cookieJarFromHeader("").names()).toEqual([]);
    expect(cookieJarFromHeader(["a=1", "b=2"]).get("b")).toBe("2");
  });
});
