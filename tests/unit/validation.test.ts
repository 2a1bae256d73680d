import { describe, expect, it } from "vitest";
import { inviteSchema } from "@/lib/auth/schemas";
import { AppError } from "@/lib/errors";
import { parseId, parseWith } from "@/lib/validation";

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
