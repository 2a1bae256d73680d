import { describe, expect, it } from "vitest";
import { inviteSchema, setPasswordSchema, signUpSchema, updatePersonSchema } from "@/lib/auth/schemas";

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
