import { describe, expect, it } from "vitest";
import { inviteSchema, setPasswordSchema, signUpSchema, updatePersonSchema } from "@/lib/auth/schemas";
import { slugify } from "@/lib/accounts/slugify";
import { clientIp } from "@/lib/auth/client-ip";
import { AppError } from "@/lib/errors";
import { inboxFileName } from "@/lib/mail/inbox-file";
import { waitPhrase } from "@/lib/rate-limit/limits";
import { parseId, parseWith } from "@/lib/validation";

describe("account schemas", () => {
  it("normalises e-mail addresses to lower case and trims names", () => {
    const parsed = inviteSchema.parse({ email: "  Ana.Lyst@Example.COM ", name: "  Ana  ", roles: ["auditor", "auditor"] });
    expect(parsed).toEqual({ email: "ana.lyst@example.com", name: "Ana", roles: ["auditor"] });
  });
  it("rejects short and oversized passwords with a reason", () => {
    const short = setPasswordSchema.safeParse({ token: "t".repeat(43), password: "123456789" });
    expect(short.success).toBe(false);
    expect(short.error?.issues[0].message).toBe("Use at least 10 characters for the password.");
    expect(setPasswordSchema.safeParse({ token: "t".repeat(43), password: "x".repeat(201) }).success).toBe(false);
    // Sign-up takes no password: it is chosen through the confirmation link.
    expect(signUpSchema.strict().safeParse({ companyName: "Works", name: "A", email: "a@b.example", password: "long-enough-pw" }).success).toBe(false);
  });
  it("refuses an empty update", () => {
    expect(updatePersonSchema.safeParse({}).success).toBe(false);
    expect(updatePersonSchema.safeParse({ active: false }).success).toBe(true);
  });
});

describe("validation helpers", () => {
  it("turns zod failures into a 400 with field messages", () => {
    try {
      parseWith(inviteSchema.strict(), { email: "x", name: "", roles: ["boss"], extra: 1 });
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(AppError);
      const e = err as AppError;
      expect(e.status).toBe(400);
      expect(e.fieldErrors).toMatchObject({ email: expect.stringMatching(/valid e-mail/), name: "Enter a name.", _: "Unknown field: extra." });
    }
  });
  it("treats malformed ids as not found", () => {
    expect(() => parseId("1 OR 1=1", "That lot")).toThrow("That lot was not found.");
    expect(parseId("0F8FAD5B-D9CB-469F-A165-70867728950E", "x")).toBe("0f8fad5b-d9cb-469f-a165-70867728950e");
  });
});

describe("small pure helpers", () => {
  it("slugify keeps ASCII letters and digits", () => {
    expect(slugify("Vellmoor Spares & Co.")).toBe("vellmoor-spares-co");
    expect(slugify("Ølstrøm Ærø")).toBe("lstr-m-r");
    expect(slugify("!!!")).toBe("workspace");
  });
  it("waitPhrase says seconds under a minute and rounds minutes up", () => {
    expect(waitPhrase(1)).toBe("Wait 1 second");
    expect(waitPhrase(40)).toBe("Wait 40 seconds");
    expect(waitPhrase(60)).toBe("Wait 1 minute");
    expect(waitPhrase(61)).toBe("Wait 2 minutes");
    expect(waitPhrase(900)).toBe("Wait 15 minutes");
  });
  it("clientIp takes the first X-Forwarded-For entry", () => {
    expect(clientIp(new Headers({ "x-forwarded-for": "198.51.100.4, 10.0.0.1" }))).toBe("198.51.100.4");
    expect(clientIp({})).toBe("unknown");
  });
  it("inboxFileName is stable per Message-ID", () => {
    expect(inboxFileName("<a@b>")).toBe(inboxFileName(" <a@b> "));
    expect(inboxFileName("<a@b>")).not.toBe(inboxFileName("<a@c>"));
    expect(inboxFileName("<a@b>")).toMatch(/^[0-9a-f]{32}\.eml$/);
  });
});
