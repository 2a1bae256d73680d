/**
 * Security headers on every kind of answer the server gives (issue 14, item 6): JSON answers,
 * refusals, pages, the sign-in redirect and the build's static files. The browser test
 * (tests/e2e/security-headers.spec.ts) checks that the pages still work under the policy.
 *
 * What the headers mean: MDN, "Content-Security-Policy" (frame-ancestors, nonce sources),
 * "X-Content-Type-Options", "Referrer-Policy", "Permissions-Policy" (a, read in a public source).
 */
import { describe, expect, it } from "vitest";
import { api, BASE_URL, signIn } from "../support/http";

function expectCommonHeaders(headers: Headers, what: string) {
  expect(headers.get("x-content-type-options"), what).toBe("nosniff");
  expect(headers.get("referrer-policy"), what).toBe("strict-origin-when-cross-origin");
  expect(headers.get("permissions-policy"), what).toMatch(/(^|, )camera=\(self\)/);
  expect(headers.get("x-frame-options"), what).toBe("DENY");
  // The test server is plain http: a browser that saw HSTS there would lock the host to https.
  expect(headers.get("strict-transport-security"), what).toBeNull();
}

describe("security headers", () => {
  it("JSON answers, refusals included, carry the headers and a CSP that allows nothing", async () => {
    const lead = await signIn("lead@vellmoor.example");
    const answers = {
      "a JSON answer": await api(lead, "GET", "/api/me"),
      "a 401": await api(null, "GET", "/api/me"),
      "a 404": await api(lead, "GET", "/api/photos/not-a-photo"),
      "a cross-site refusal": await api(lead, "POST", "/api/suppliers", { name: "Header Check" }, { origin: "https://elsewhere.example" }),
      "the health check": await api(null, "GET", "/api/health"),
      "next-auth's own answer": await api(null, "GET", "/api/auth/csrf"),
      "a path no route answers": await api(lead, "GET", "/api/no-such-route"),
    };
    for (const [what, res] of Object.entries(answers)) {
      expectCommonHeaders(res.headers, what);
      expect(res.headers.get("content-security-policy"), what).toBe("default-src 'none'; frame-ancestors 'none'");
    }
  });

  it("pages get a fresh nonce per answer, and the nonce is on the page's scripts", async () => {
    const pages = await Promise.all([1, 2].map(() => fetch(`${BASE_URL}/sign-in`)));
    const policies = pages.map((p) => p.headers.get("content-security-policy") ?? "");
    for (const [i, page] of pages.entries()) {
      expect(page.status).toBe(200);
      expectCommonHeaders(page.headers, "the sign-in page");
      expect(policies[i]).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}' 'strict-dynamic'/);
      expect(policies[i]).toContain("frame-ancestors 'none'");
      expect(policies[i]).not.toMatch(/script-src[^;]*'unsafe-(inline|eval)'/);
      const nonce = policies[i].match(/'nonce-([^']+)'/)![1];
      const html = await page.text();
      const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
      expect(scripts.length).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
    }
    expect(policies[0].match(/'nonce-([^']+)'/)![1]).not.toBe(policies[1].match(/'nonce-([^']+)'/)![1]);
  });

  it("the redirect to sign-in and the build's static files carry them too", async () => {
    const redirect = await fetch(`${BASE_URL}/queue`, { redirect: "manual" });
    expect(redirect.status).toBeGreaterThanOrEqual(300);
    expect(redirect.status).toBeLessThan(400);
    expectCommonHeaders(redirect.headers, "the redirect");
    expect(redirect.headers.get("content-security-policy")).toContain("frame-ancestors 'none'");

    const html = await (await fetch(`${BASE_URL}/sign-in`)).text();
    const chunk = html.match(/\/_next\/static\/[^"']+\.js/)![0];
    const file = await fetch(`${BASE_URL}${chunk}`);
    expect(file.status).toBe(200);
    expectCommonHeaders(file.headers, "a static chunk");
  });
});
