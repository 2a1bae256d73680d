/**
 * Signed tokens. The MAC is HMAC-SHA-256 (RFC 2104 / FIPS 198-1, a); the first test recomputes it
 * with node:crypto from the documented construction, so a change of format cannot pass silently.
 * RFC 4231 test case 2 (from memory, b) checks the HMAC primitive the construction relies on.
 */
import { createHmac } from "node:crypto";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { MAX_TOKEN_LENGTH, signToken, verifyToken } from "@/lib/signing/signed-token";

const secret = "unit-test-secret-0123456789abcdef";
const schema = z.object({ id: z.string() }).strict();
const now = new Date("2026-12-01T10:00:00Z");
const later = new Date("2026-12-08T10:00:00Z");

describe("signToken / verifyToken", () => {
  it("is base64url JSON plus HMAC-SHA-256 under a key derived per purpose (recomputed here)", () => {
    const token = signToken("demo", { id: "x1" }, { secret, expiresAt: later });
    const [body, mac] = token.split(".");
    expect(JSON.parse(Buffer.from(body, "base64url").toString())).toEqual({ v: 1, id: "x1", exp: later.getTime() / 1000 });
    const key = createHmac("sha256", secret).update("partproof demo v1").digest();
    expect(mac).toBe(createHmac("sha256", key).update(body).digest("base64url"));
  });

  it("relies on node's HMAC-SHA-256, which matches RFC 4231 test case 2 (b)", () => {
    expect(createHmac("sha256", "Jefe").update("what do ya want for nothing?").digest("hex")).toBe("5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843");
  });

  it("verifies what it signed and reports the expiry", () => {
    const token = signToken("demo", { id: "x1" }, { secret, expiresAt: later });
    expect(verifyToken("demo", token, schema, { secret, now })).toEqual({ ok: true, claims: { id: "x1" }, expiresAt: later });
  });

  it("expires at its exp second, not a second later", () => {
    const token = signToken("demo", { id: "x1" }, { secret, expiresAt: later });
    expect(verifyToken("demo", token, schema, { secret, now: new Date(later.getTime() - 1) }).ok).toBe(true);
    expect(verifyToken("demo", token, schema, { secret, now: later })).toEqual({ ok: false, reason: "expired" });
  });

  it("refuses a changed payload, a changed MAC, another secret and another purpose", () => {
    const token = signToken("demo", { id: "x1" }, { secret, expiresAt: later });
    const [body, mac] = token.split(".");
    const forgedBody = Buffer.from(JSON.stringify({ v: 1, id: "x2", exp: later.getTime() / 1000 })).toString("base64url");
    expect(verifyToken("demo", `${forgedBody}.${mac}`, schema, { secret, now })).toEqual({ ok: false, reason: "signature" });
    // A later expiry is a forgery too.
    const extended = Buffer.from(JSON.stringify({ v: 1, id: "x1", exp: later.getTime() / 1000 + 86400 })).toString("base64url");
    expect(verifyToken("demo", `${extended}.${mac}`, schema, { secret, now })).toEqual({ ok: false, reason: "signature" });
    const flipped = mac.slice(0, 10) + (mac[10] === "A" ? "B" : "A") + mac.slice(11);
    expect(verifyToken("demo", `${body}.${flipped}`, schema, { secret, now })).toEqual({ ok: false, reason: "signature" });
    expect(verifyToken("demo", token, schema, { secret: `${secret}x`, now })).toEqual({ ok: false, reason: "signature" });
    expect(verifyToken("other", token, schema, { secret, now })).toEqual({ ok: false, reason: "signature" });
  });

  it("refuses a MAC written differently (padding, other alphabet) even when it decodes to the same bytes", () => {
    const token = signToken("demo", { id: "x1" }, { secret, expiresAt: later });
    const [body, mac] = token.split(".");
    const padded = Buffer.from(mac, "base64url").toString("base64");
    expect(verifyToken("demo", `${body}.${padded}`, schema, { secret, now })).toEqual({ ok: false, reason: "signature" });
  });

  it("calls junk malformed, and refuses overlong input before hashing", () => {
    for (const junk of ["", "abc", "a.b.c", ".", "abc.", ".abc"]) expect(verifyToken("demo", junk, schema, { secret, now })).toEqual({ ok: false, reason: "malformed" });
    expect(verifyToken("demo", "a".repeat(MAX_TOKEN_LENGTH + 1), schema, { secret, now })).toEqual({ ok: false, reason: "malformed" });
  });

  it("checks the claims with the caller's schema only after the MAC", () => {
    const token = signToken("demo", { id: 7 }, { secret, expiresAt: later });
    expect(verifyToken("demo", token, schema, { secret, now })).toEqual({ ok: false, reason: "malformed" });
  });

  it("keeps v and exp for itself", () => {
    expect(() => signToken("demo", { exp: 1 }, { secret, expiresAt: later })).toThrow(/reserved/);
    expect(() => signToken("demo", { id: "x" }, { secret, expiresAt: new Date(Number.NaN) })).toThrow(/expiry/);
  });
});
