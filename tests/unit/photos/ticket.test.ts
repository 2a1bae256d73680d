import { describe, expect, it } from "vitest";
import { signUploadTicket, verifyUploadTicket, type UploadTicket } from "@/lib/photos/ticket";

const secret = "unit-test-secret-0123456789abcdef";
const ticket: UploadTicket = {
  workspaceId: "0b7c5f0e-5b8f-4c52-9a55-3c2f0f1f0a01",
  unitId: "2f1d7a9c-1e0b-4c7d-8f3a-6b5e4d3c2b1a",
  photoId: "7e6d5c4b-3a29-4817-a6b5-c4d3e2f1a0b9",
  viewKey: "front",
  fileName: "IMG_0001.jpg",
  uploaderId: "9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d",
};
const now = new Date("2026-12-01T10:00:00Z");
const inAnHour = new Date("2026-12-01T11:00:00Z");

describe("upload tickets", () => {
  it("verify what they were signed with", () => {
    const token = signUploadTicket(ticket, { secret, expiresAt: inAnHour });
    expect(verifyUploadTicket(token, { secret, now })).toEqual({ ok: true, ticket });
  });

  it("expire", () => {
    const token = signUploadTicket(ticket, { secret, expiresAt: inAnHour });
    expect(verifyUploadTicket(token, { secret, now: inAnHour })).toEqual({ ok: false, reason: "expired" });
  });

  it("refuse any change to the payload, another secret, and junk", () => {
    const token = signUploadTicket(ticket, { secret, expiresAt: inAnHour });
    const [body, mac] = token.split(".");
    const forged = Buffer.from(JSON.stringify({ ...JSON.parse(Buffer.from(body, "base64url").toString()), unitId: ticket.workspaceId })).toString("base64url");
    expect(verifyUploadTicket(`${forged}.${mac}`, { secret, now })).toEqual({ ok: false, reason: "signature" });
    expect(verifyUploadTicket(token, { secret: `${secret}x`, now })).toEqual({ ok: false, reason: "signature" });
    expect(verifyUploadTicket("not-a-ticket", { secret, now })).toEqual({ ok: false, reason: "malformed" });
    expect(verifyUploadTicket(`${body}.`, { secret, now })).toEqual({ ok: false, reason: "malformed" });
  });
});
