import { describe, expect, it } from "vitest";
import { inboxFileName } from "@/lib/mail/inbox-file";

describe("inboxFileName", () => {
  it("is stable per Message-ID", () => {
    expect(inboxFileName("<a@b>")).toBe(inboxFileName(" <a@b> "));
    expect(inboxFileName("<a@b>")).not.toBe(inboxFileName("<a@c>"));
    expect(inboxFileName("<a@b>")).toMatch(/^[0-9a-f]{32}\.eml$/);
  });
});
