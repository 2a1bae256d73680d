import { createDecipheriv, createHmac } from "node:crypto";
import { describe, expect, it } from "vitest";
import { open, seal } from "@/lib/signing/sealed-box";

const secret = "s".repeat(44);
const message = { to: "new.person@example.test", text: "Set your password: https://qc.example/set-password?token=abcDEF123" };

describe("seal / open", () => {
  it("round-trips a JSON value, and the box does not show it", () => {
    const box = seal("mail-job", message, { secret });
    expect(open("mail-job", box, { secret })).toEqual(message);
    expect(box).not.toContain("abcDEF123");
    expect(Buffer.from(box.replaceAll(".", ""), "base64url").toString("latin1")).not.toContain("abcDEF123");
    // A fresh IV each time: the same value never seals to the same box.
    expect(seal("mail-job", message, { secret })).not.toBe(box);
  });

  it("opens nothing that was altered, or sealed for another purpose or secret", () => {
    const box = seal("mail-job", message, { secret });
    const [iv, tag, body] = box.split(".");
    const flipped = Buffer.from(body, "base64url");
    flipped[0] ^= 1;
    expect(open("mail-job", [iv, tag, flipped.toString("base64url")].join("."), { secret })).toBeNull();
    expect(open("upload-ticket", box, { secret })).toBeNull();
    expect(open("mail-job", box, { secret: "t".repeat(44) })).toBeNull();
    for (const junk of ["", "a.b", "a.b.c", `${iv}.${tag}`, 42 as unknown as string]) expect(open("mail-job", junk, { secret })).toBeNull();
  });

  // The format as documented, opened with node:crypto directly (OpenSSL's AES-256-GCM; the mode
  // itself: NIST SP 800-38D (a, read in a public source)): key = HMAC-SHA-256(secret, label),
  // additional data = the purpose, "<iv>.<tag>.<ciphertext>" in base64url.
  it("is AES-256-GCM under the documented key and layout", () => {
    const [iv, tag, body] = seal("mail-job", message, { secret })
      .split(".")
      .map((p) => Buffer.from(p, "base64url"));
    const decipher = createDecipheriv("aes-256-gcm", createHmac("sha256", secret).update("partproof mail-job seal v1").digest(), iv);
    decipher.setAAD(Buffer.from("mail-job"));
    decipher.setAuthTag(tag);
    expect(JSON.parse(Buffer.concat([decipher.update(body), decipher.final()]).toString("utf8"))).toEqual(message);
  });
});
