import { describe, expect, it } from "vitest";
import { appOrigins, crossSiteRefusal } from "@/lib/http/request-guard";

const allowedOrigins = appOrigins({ appUrl: "http://127.0.0.1:3000", host: "127.0.0.1:3000", https: false });
const check = (method: string, headers: Record<string, string>, pathname = "/api/suppliers") => crossSiteRefusal({ method, pathname, headers: new Headers(headers), allowedOrigins });
const json = { "content-type": "application/json", "content-length": "12" };

// What browsers send (a, MDN "Origin": sent with POST, PUT, PATCH and DELETE, also same-origin;
// MDN "Sec-Fetch-Site": cross-site | same-site | same-origin | none) and which bodies an HTML
// form can post without a CORS preflight (a, Fetch standard, "CORS-safelisted request-header":
// application/x-www-form-urlencoded, multipart/form-data, text/plain).
describe("crossSiteRefusal", () => {
  it("lets reads through from anywhere", () => {
    expect(check("GET", { origin: "https://evil.example", "sec-fetch-site": "cross-site" })).toBeNull();
    expect(check("HEAD", {})).toBeNull();
  });

  it("passes a JSON write from the app's own page", () => {
    expect(check("POST", { ...json, origin: "http://127.0.0.1:3000", "sec-fetch-site": "same-origin" })).toBeNull();
    expect(check("DELETE", { origin: "http://127.0.0.1:3000" })).toBeNull();
  });

  it("refuses a write whose Origin is another site, with a sentence", () => {
    const refusal = check("POST", { ...json, origin: "https://evil.example" });
    expect(refusal).toMatchObject({ status: 403, code: "forbidden" });
    expect(refusal?.message).toMatch(/another site/);
    expect(check("PUT", { ...json, origin: "null" })?.status).toBe(403);
    expect(check("PATCH", { ...json, origin: "http://127.0.0.1:3001" })?.status).toBe(403);
  });

  it("refuses cross-site and same-site fetch metadata even without an Origin", () => {
    expect(check("POST", { ...json, "sec-fetch-site": "cross-site" })?.status).toBe(403);
    expect(check("POST", { ...json, "sec-fetch-site": "same-site" })?.status).toBe(403);
    expect(check("POST", { ...json, "sec-fetch-site": "none" })).toBeNull();
  });

  it("answers 415 for a body that is not JSON (what a form could post)", () => {
    for (const type of ["application/x-www-form-urlencoded", "multipart/form-data; boundary=x", "text/plain"]) {
      expect(check("POST", { "content-type": type, "content-length": "5" })).toMatchObject({ status: 415, code: "unsupported_media_type" });
    }
    expect(check("POST", { "content-length": "5" })?.status).toBe(415);
    expect(check("POST", { "transfer-encoding": "chunked" })?.status).toBe(415);
    expect(check("POST", { "content-type": "application/json; charset=utf-8", "content-length": "2" })).toBeNull();
    expect(check("POST", { "content-type": "application/json-patch+json", "content-length": "2" })?.status).toBe(415);
  });

  it("passes a write without a body (release a lease, retry a photo)", () => {
    expect(check("DELETE", {})).toBeNull();
    expect(check("POST", { "content-length": "0" })).toBeNull();
  });

  it("leaves next-auth's form posts to its own CSRF token, but still checks their origin", () => {
    const form = { "content-type": "application/x-www-form-urlencoded", "content-length": "40" };
    expect(check("POST", form, "/api/auth/callback/credentials")).toBeNull();
    expect(check("POST", { ...form, origin: "https://evil.example" }, "/api/auth/signout")?.status).toBe(403);
  });
});

describe("appOrigins", () => {
  it("holds APP_URL's origin and the Host the browser reached, lower-cased", () => {
    expect(appOrigins({ appUrl: "https://QC.Example.com/app", host: "QC-internal:8443", https: true })).toEqual(["https://qc.example.com", "https://qc-internal:8443"]);
    expect(appOrigins({ appUrl: "http://127.0.0.1:3000", host: null, https: false })).toEqual(["http://127.0.0.1:3000"]);
  });
});
