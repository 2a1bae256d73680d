import { describe, expect, it } from "vitest";
import { judgePublicRecord, signPublicLink, verifyPublicLink } from "@/lib/reports/public-links";

const secret = "unit-test-secret-0123456789abcdef";
const id = "7e6d5c4b-3a29-4817-a6b5-c4d3e2f1a0b9";
const now = new Date("2026-12-01T10:00:00Z");
const inAWeek = new Date("2026-12-08T10:00:00Z");

describe("public links (evidence pack, certificate)", () => {
  it("open the record they name until they expire", () => {
    const token = signPublicLink("evidence-pack", id, { secret, expiresAt: inAWeek });
    expect(verifyPublicLink("evidence-pack", token, { secret, now })).toEqual({ ok: true, id, expiresAt: inAWeek });
    const expired = verifyPublicLink("evidence-pack", token, { secret, now: inAWeek });
    expect(expired).toMatchObject({ ok: false, reason: "expired" });
    expect(!expired.ok && expired.message).toMatch(/expired.*new one/);
  });

  it("never open the other kind of page", () => {
    const token = signPublicLink("evidence-pack", id, { secret, expiresAt: inAWeek });
    expect(verifyPublicLink("certificate", token, { secret, now })).toMatchObject({ ok: false, reason: "invalid" });
  });

  it("answer a plain sentence for a tampered token or a wrong secret", () => {
    const token = signPublicLink("certificate", id, { secret, expiresAt: inAWeek });
    const tampered = token.slice(0, 5) + (token[5] === "x" ? "y" : "x") + token.slice(6);
    for (const check of [verifyPublicLink("certificate", tampered, { secret, now }), verifyPublicLink("certificate", token, { secret: "another-secret-0123456789", now })]) {
      expect(check).toMatchObject({ ok: false, reason: "invalid" });
      expect(!check.ok && check.message).toMatch(/not valid/);
    }
  });

  it("are refused once the record is revoked, and read like a bad token when the record is gone", () => {
    const token = signPublicLink("certificate", id, { secret, expiresAt: inAWeek });
    const check = verifyPublicLink("certificate", token, { secret, now });
    expect(judgePublicRecord("certificate", check, { revokedAt: null })).toEqual(check);
    const revoked = judgePublicRecord("certificate", check, { revokedAt: now });
    expect(revoked).toMatchObject({ ok: false, reason: "revoked" });
    expect(!revoked.ok && revoked.message).toMatch(/revoked/);
    expect(judgePublicRecord("certificate", check, null)).toMatchObject({ ok: false, reason: "invalid" });
  });

  it("sign only record ids", () => {
    expect(() => signPublicLink("certificate", "not-a-uuid", { secret, expiresAt: inAWeek })).toThrow();
  });
});
