/** Links in plain e-mail text (the Outbox): which characters end an address is our rule (c). */
import { describe, expect, it } from "vitest";
import { linkifyText } from "@/lib/mail/linkify";

describe("linkifyText", () => {
  it("turns http and https addresses into links and keeps the text around them", () => {
    expect(linkifyText("Set your password: https://qc.example/set-password?token=abc_123 (valid 72 hours).")).toEqual([
      { kind: "text", text: "Set your password: " },
      { kind: "link", href: "https://qc.example/set-password?token=abc_123" },
      { kind: "text", text: " (valid 72 hours)." },
    ]);
  });

  it("leaves a sentence's full stop, comma or bracket out of the address", () => {
    expect(linkifyText("See http://127.0.0.1:3000/lots/1.")).toEqual([
      { kind: "text", text: "See " },
      { kind: "link", href: "http://127.0.0.1:3000/lots/1" },
      { kind: "text", text: "." },
    ]);
    expect(linkifyText("(http://a.example/x), then")).toEqual([
      { kind: "text", text: "(" },
      { kind: "link", href: "http://a.example/x" },
      { kind: "text", text: "), then" },
    ]);
  });

  it("never links other schemes, and plain text stays one part", () => {
    expect(linkifyText("javascript:alert(1) mailto:a@b.example")).toEqual([{ kind: "text", text: "javascript:alert(1) mailto:a@b.example" }]);
    expect(linkifyText("")).toEqual([]);
  });
});
