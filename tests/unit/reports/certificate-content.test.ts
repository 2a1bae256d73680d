/**
 * The certificate's content hash: what is hashed (the canonical form) and that it is stable.
 * Canonical JSON follows RFC 8785 (a): keys sorted by UTF-16 code units, no whitespace, numbers in
 * ECMAScript form. The expected canonical text below is written out by hand and its SHA-256 is
 * computed with node:crypto, independently of the module.
 */
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { describe, expect, it } from "vitest";
import { canonicalCertificate, certificateHash, groupedHash, type CertificateData } from "@/lib/reports/certificate-content";

const base: CertificateData = {
  certificateId: "7e6d5c4b-3a29-4817-a6b5-c4d3e2f1a0b9",
  shortCode: "7KQ2-M9XD-3VR",
  issuedAt: new Date("2026-12-01T10:30:00Z"),
  workspaceName: "Vellmoor Parts",
  partType: "Rear camera module",
  modelFamily: "Korvo X2",
  serial: "OV-CAM-24-000113",
  grade: "B",
  explanation: ["Scratch: 1.8 % of the surface ≥ 1 % → B"],
  rubric: { name: "Camera cosmetic", version: 3 },
  checklist: [
    { label: "Autofocus in every mode", result: "pass" },
    { label: "Flash", result: "fail", detail: "no light" },
  ],
  views: [{ label: "Front", photoSha256: "AB".repeat(32), thumbnail: Buffer.from([1, 2, 3]) }],
  verificationUrl: "https://example.invalid/verify/abc",
};

const expectedCanonical =
  '{"certificateId":"7e6d5c4b-3a29-4817-a6b5-c4d3e2f1a0b9",' +
  '"checklist":[{"detail":"","label":"Autofocus in every mode","result":"pass"},{"detail":"no light","label":"Flash","result":"fail"}],' +
  '"explanation":["Scratch: 1.8 % of the surface ≥ 1 % → B"],' +
  '"grade":"B","issuedAt":"2026-12-01T10:30:00.000Z","modelFamily":"Korvo X2","partType":"Rear camera module",' +
  '"rubric":{"name":"Camera cosmetic","version":3},"serial":"OV-CAM-24-000113","shortCode":"7KQ2-M9XD-3VR",' +
  `"v":1,"views":[{"label":"Front","photoSha256":"${"ab".repeat(32)}"}],"workspace":"Vellmoor Parts"}`;

describe("certificate content", () => {
  it("is the hand-written canonical JSON, and the hash is its SHA-256", () => {
    expect(canonicalCertificate(base)).toBe(expectedCanonical);
    expect(certificateHash(base)).toBe(createHash("sha256").update(expectedCanonical, "utf8").digest("hex"));
  });

  it("does not depend on property order, thumbnails, the URL, or how an accent was typed", () => {
    const reordered = Object.fromEntries(Object.entries(base).reverse()) as CertificateData;
    expect(certificateHash(reordered)).toBe(certificateHash(base));
    expect(certificateHash({ ...base, verificationUrl: "http://127.0.0.1:3000/verify/xyz", views: [{ ...base.views[0], thumbnail: Buffer.from([9]) }] })).toBe(certificateHash(base));
    const composed = { ...base, workspaceName: "Zoë Łukasiewicz Repairs" };
    const decomposed = { ...base, workspaceName: "Zoe\u0308 Łukasiewicz Repairs" };
    expect(decomposed.workspaceName).not.toBe(composed.workspaceName);
    expect(certificateHash(decomposed)).toBe(certificateHash(composed));
  });

  it("changes with every fact the certificate states", () => {
    const hash = certificateHash(base);
    const variants: Partial<CertificateData>[] = [
      { grade: "C" },
      { serial: "OV-CAM-24-000114" },
      { issuedAt: new Date("2026-12-01T10:30:01Z") },
      { explanation: [...base.explanation, "Dent: 1 ≥ 1 → B"] },
      { rubric: { name: "Camera cosmetic", version: 4 } },
      { checklist: [base.checklist[0]] },
      { views: [{ ...base.views[0], photoSha256: "cd".repeat(32) }] },
      { workspaceName: "Another issuer" },
    ];
    for (const variant of variants) expect(certificateHash({ ...base, ...variant })).not.toBe(hash);
  });

  it("refuses an invalid issue date", () => {
    expect(() => certificateHash({ ...base, issuedAt: new Date(Number.NaN) })).toThrow(/not a valid date/);
  });

  it("prints the hash in groups of eight", () => {
    expect(groupedHash("0123456789abcdef0123456789abcdef")).toBe("01234567 89abcdef 01234567 89abcdef");
  });
});

describe("canonicalize (RFC 8785 rules the hash relies on, a)", () => {
  it("sorts keys by UTF-16 code units and writes ECMAScript numbers", () => {
    expect(canonicalize({ b: 1, a: [4.5, 1e21, 0.1 + 0.2], é: true, Z: null })).toBe('{"Z":null,"a":[4.5,1e+21,0.30000000000000004],"b":1,"é":true}');
  });
});
