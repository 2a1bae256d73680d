import { describe, expect, it } from "vitest";
import { inviteSchema, signUpSchema, updatePersonSchema } from "@/lib/auth/schemas";

describe("account schemas", () => {
  it("normalises e-mail addresses to lower case and trims names", () => {
    const parsed = inviteSchema.parse({ email: "  Ana.Lyst@Example.COM ", name: "  Ana  ", roles: ["auditor", "auditor"] });
    expect(parsed).toEqual({ email: "ana.lyst@example.com", name: "Ana", roles: ["auditor"] });
  });
  it("rejects short and oversized passwords with a reason", () => {
    const short = signUpSchema.safeParse({ companyName: "Works", name: "A", email: "a@b.example", password: "123456789" });
    expect(short.success).toBe(false);
    expect(short.error?.issues[0].message).toBe("Use at least 10 characters for the password.");
    expect(signUpSchema.safeParse({ companyName: "Works", name: "A", email: "a@b.example", password: "x".repeat(201) }).success).toBe(false);
  });
  it("refuses an empty update", () => {
    expect(updatePersonSchema.safeParse({}).success).toBe(false);
    expect(updatePersonSchema.safeParse({ active: false }).success).toBe(true);
  });
});
