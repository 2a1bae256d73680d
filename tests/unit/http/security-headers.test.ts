import { PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { describe, expect, it } from "vitest";
import { objectStoreOrigin, pageContentSecurityPolicy, staticSecurityHeaders } from "@/lib/http/security-headers";

const directives = (csp: string) =>
  Object.fromEntries(
    csp
      .split(";")
      .map((d) => d.trim().split(/\s+/))
      .map(([name, ...values]) => [name, values]),
  );

describe("pageContentSecurityPolicy", () => {
  const csp = directives(pageContentSecurityPolicy({ nonce: "abc123", connectSources: ["http://127.0.0.1:4600"], https: false, dev: false }));

  it("runs only scripts carrying the request's nonce (and what they load), never eval in production", () => {
    expect(csp["script-src"]).toEqual(["'self'", "'nonce-abc123'", "'strict-dynamic'"]);
    expect(csp["script-src"]).not.toContain("'unsafe-inline'");
    expect(csp["script-src"]).not.toContain("'unsafe-eval'");
  });

  it("forbids framing, plugins and foreign form targets", () => {
    expect(csp["frame-ancestors"]).toEqual(["'none'"]);
    expect(csp["object-src"]).toEqual(["'none'"]);
    expect(csp["form-action"]).toEqual(["'self'"]);
    expect(csp["base-uri"]).toEqual(["'self'"]);
  });

  it("lets the browser upload to the object store and draw blob: images", () => {
    expect(csp["connect-src"]).toEqual(["'self'", "http://127.0.0.1:4600"]);
    expect(csp["img-src"]).toEqual(["'self'", "blob:", "data:"]);
  });

  it("adds eval only for the development server and upgrades requests only over https", () => {
    const dev = directives(pageContentSecurityPolicy({ nonce: "n", connectSources: [], https: true, dev: true }));
    expect(dev["script-src"]).toContain("'unsafe-eval'");
    expect(dev["upgrade-insecure-requests"]).toEqual([]);
    expect(csp["upgrade-insecure-requests"]).toBeUndefined();
  });
});

describe("staticSecurityHeaders", () => {
  it("always sends nosniff, a referrer policy and a permissions policy that keeps the camera for the app", () => {
    const headers = staticSecurityHeaders({ https: false });
    expect(headers["X-Content-Type-Options"]).toBe("nosniff");
    expect(headers["Referrer-Policy"]).toBe("strict-origin-when-cross-origin");
    expect(headers["Permissions-Policy"]).toContain("camera=(self)");
    expect(headers["Permissions-Policy"]).toContain("microphone=()");
    expect(headers["Strict-Transport-Security"]).toBeUndefined();
  });

  it("sends HSTS only over https", () => {
    expect(staticSecurityHeaders({ https: true })["Strict-Transport-Security"]).toMatch(/^max-age=\d{8}/);
  });
});

// Checked against the AWS SDK's own presigner (the library the app presigns with): the origin
// in the CSP must be the one the browser's PUT goes to, for each way a store can be addressed.
describe("objectStoreOrigin", () => {
  const cases = [
    { endpoint: "http://127.0.0.1:4600", forcePathStyle: true, region: "us-east-1" },
    { endpoint: "https://s3.eu-central-1.example.com", forcePathStyle: false, region: "eu-central-1" },
    { endpoint: undefined, forcePathStyle: false, region: "eu-west-1" },
  ];
  for (const c of cases) {
    it(`matches a presigned URL for ${c.endpoint ?? "AWS"} (${c.forcePathStyle ? "path" : "virtual-host"} style)`, async () => {
      const client = new S3Client({ region: c.region, endpoint: c.endpoint, forcePathStyle: c.forcePathStyle, credentials: { accessKeyId: "k", secretAccessKey: "s" } });
      const url = await getSignedUrl(client, new PutObjectCommand({ Bucket: "partproof", Key: "staging/x" }), { expiresIn: 60 });
      expect(objectStoreOrigin({ endpoint: c.endpoint, bucket: "partproof", region: c.region, forcePathStyle: c.forcePathStyle })).toBe(new URL(url).origin);
    });
  }
});
