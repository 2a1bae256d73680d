import { encode } from "next-auth/jwt";
import { describe, expect, it } from "vitest";
import { decodeSessionToken } from "@/lib/auth/session-token";

const secret = "a-test-secret-that-is-long-enough-0123456789";
const claims = { sub: "1b0c5c7e-3a52-4a8f-9a57-2a6a1b7e0c11", workspaceId: "ws-1", tokenVersion: 3, roles: ["inspector" as const] };

// The reference is next-auth's own encoder (next-auth 4.24, the package that issues the cookie):
// a token it writes must read back with the same claims, and nothing else may.
describe("decodeSessionToken", () => {
  it("reads back the claims of a cookie written by next-auth's encode", async () => {
    const token = await encode({ token: claims, secret, maxAge: 3600 });
    const payload = await decodeSessionToken(token, secret);
    expect(payload).toMatchObject(claims);
    expect(payload?.exp).toBeGreaterThan(Date.now() / 1000);
  });

  it("keeps working when the secret changes (the cached key follows it)", async () => {
    const other = `${secret}-rotated`;
    expect(await decodeSessionToken(await encode({ token: claims, secret, maxAge: 60 }), secret)).not.toBeNull();
    expect(await decodeSessionToken(await encode({ token: claims, secret: other, maxAge: 60 }), other)).toMatchObject(claims);
    expect(await decodeSessionToken(await encode({ token: claims, secret, maxAge: 60 }), secret)).toMatchObject(claims);
  });

  it("refuses a token encrypted with another secret", async () => {
    const token = await encode({ token: claims, secret: "some-other-secret-0123456789abcdef", maxAge: 3600 });
    expect(await decodeSessionToken(token, secret)).toBeNull();
  });

  it("refuses a token with a changed byte", async () => {
    const token = await encode({ token: claims, secret, maxAge: 3600 });
    const parts = token.split(".");
    const ciphertext = Buffer.from(parts[3], "base64url");
    ciphertext[0] ^= 1;
    parts[3] = ciphertext.toString("base64url");
    expect(await decodeSessionToken(parts.join("."), secret)).toBeNull();
  });

  it("refuses an expired token beyond next-auth's 15 s clock tolerance, and empty input", async () => {
    expect(await decodeSessionToken(await encode({ token: claims, secret, maxAge: -60 }), secret)).toBeNull();
    expect(await decodeSessionToken(await encode({ token: claims, secret, maxAge: -5 }), secret)).toMatchObject(claims);
    expect(await decodeSessionToken("", secret)).toBeNull();
    expect(await decodeSessionToken("not.a.token", secret)).toBeNull();
  });
});
