import { describe, expect, it } from "vitest";
import { isLoopbackUrl, isProductionStart, productionStartProblems } from "@/lib/production-check";

const secret = "x".repeat(44);

describe("productionStartProblems", () => {
  it("lets the local demo start without a secret (npm start generates one)", () => {
    expect(productionStartProblems({ NODE_ENV: "production", APP_URL: "http://127.0.0.1:3000" })).toEqual([]);
    expect(productionStartProblems({ NODE_ENV: "production", APP_URL: "http://localhost:3000" })).toEqual([]);
    expect(productionStartProblems({ NODE_ENV: "development", APP_URL: "https://qc.example.com" })).toEqual([]);
  });

  it("refuses a production start without NEXTAUTH_SECRET, saying why", () => {
    const [problem] = productionStartProblems({ NODE_ENV: "production", APP_URL: "https://qc.example.com" });
    expect(problem).toMatch(/NEXTAUTH_SECRET is not set/);
    expect(problem).toMatch(/https:\/\/qc\.example\.com.*not a loopback address/);
    expect(productionStartProblems({ NODE_ENV: "production", APP_URL: "https://qc.example.com", NEXTAUTH_SECRET: secret })).toEqual([]);
  });

  it("treats PARTPROOF_PRODUCTION=true as production even on loopback", () => {
    expect(isProductionStart({ PARTPROOF_PRODUCTION: "true", APP_URL: "http://127.0.0.1:3000" })).toBe(true);
    expect(productionStartProblems({ PARTPROOF_PRODUCTION: "true" })[0]).toMatch(/PARTPROOF_PRODUCTION is set/);
  });

  it("refuses a short secret in production", () => {
    expect(productionStartProblems({ NODE_ENV: "production", APP_URL: "https://qc.example.com", NEXTAUTH_SECRET: "short-secret-1234" })[0]).toMatch(/shorter than 32/);
  });
});

describe("isLoopbackUrl", () => {
  it("knows 127.0.0.0/8, localhost and ::1, and nothing else", () => {
    for (const url of ["http://127.0.0.1:3000", "http://127.8.9.10", "http://localhost", "http://[::1]:3000"]) expect(isLoopbackUrl(url)).toBe(true);
    for (const url of ["http://10.0.0.1", "https://qc.example.com", "http://127.0.0.1.example.com", "not a url"]) expect(isLoopbackUrl(url)).toBe(false);
  });
});
