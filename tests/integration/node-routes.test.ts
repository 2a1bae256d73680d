/**
 * The production server's plain Node routes (lib/http/node-routes.ts) against the test server,
 * which runs scripts/serve.ts as production does: GET /api/gallery is answered without Next.js,
 * and its answers carry what an App Router route's carry — the same security headers, the same
 * session and permission checks, the same error bodies — and only the caller's workspace.
 */
import { beforeAll, describe, expect, it } from "vitest";
import type { GalleryCardDto } from "@/lib/gallery/dto";
import { staticSecurityHeaders } from "@/lib/http/security-headers";
import { createGradedPhoto, insertItem, SCRATCHED } from "../support/gallery";
import { api, BASE_URL, signIn, type Session } from "../support/http";

type Page = { items: GalleryCardDto[]; nextCursor: string | null };
type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };

let inspector: Session;
let lead: Session;
let ownItemId: string;
let foreignItemId: string;
let partTypeId: string;

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  const scene = await createGradedPhoto(lead, { extraPhotos: 1 });
  partTypeId = scene.partType.id;
  ownItemId = (await insertItem(scene.owner, { partTypeId, photoId: scene.extra[0].id, status: "published", regions: SCRATCHED })).id;
  const quillfen = await createGradedPhoto(await signIn("lead@quillfen.example"), { extraPhotos: 1 });
  foreignItemId = (await insertItem(quillfen.owner, { partTypeId: quillfen.partType.id, photoId: quillfen.extra[0].id, status: "published", regions: SCRATCHED })).id;
});

/** The request-independent headers every /api answer carries (next.config.ts; the test server is plain http). */
const SECURITY_HEADERS = { ...staticSecurityHeaders({ https: false }), "Content-Security-Policy": "default-src 'none'; frame-ancestors 'none'" };
const securityHeadersOf = (headers: Headers) => Object.fromEntries(Object.keys(SECURITY_HEADERS).map((name) => [name, headers.get(name)]));

describe("GET /api/gallery on the production server", () => {
  it("is answered by the plain Node route: one body of a stated length, no Next.js routing headers", async () => {
    const res = await fetch(`${BASE_URL}/api/gallery?partType=${partTypeId}&limit=5`, { headers: { cookie: inspector.cookie } });
    const text = await res.text();
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/json");
    expect(res.headers.get("content-length")).toBe(String(Buffer.byteLength(text)));
    expect(res.headers.get("transfer-encoding")).toBeNull();
    // An App Router answer varies on the router's own request headers (next-router-state-tree, …).
    expect(res.headers.get("vary")).toBeNull();
    expect((JSON.parse(text) as Page).items.map((i) => i.id)).toEqual([ownItemId]);
  });

  it("carries the security headers of an App Router API answer", async () => {
    const list = await api(inspector, "GET", `/api/gallery?limit=1`);
    const item = await api(inspector, "GET", `/api/gallery/${ownItemId}`);
    expect(item.headers.get("vary")).not.toBeNull(); // the item is an App Router answer
    expect(securityHeadersOf(list.headers)).toEqual(SECURITY_HEADERS);
    expect(securityHeadersOf(item.headers)).toEqual(SECURITY_HEADERS);
  });

  it("shows only the caller's workspace", async () => {
    const ids: string[] = [];
    let cursor: string | null = null;
    do {
      const page: { body: Page } = await api<Page>(inspector, "GET", `/api/gallery?limit=100${cursor ? `&cursor=${cursor}` : ""}`);
      ids.push(...page.body.items.map((i) => i.id));
      cursor = page.body.nextCursor;
    } while (cursor);
    expect(ids).toContain(ownItemId);
    expect(ids).not.toContain(foreignItemId);
  });

  it("answers 401 without a session or with a forged cookie, with the body an App Router route gives", async () => {
    const appRoute = await api<ErrorBody>(null, "GET", `/api/gallery/${ownItemId}`);
    expect(appRoute.status).toBe(401);
    for (const cookie of [undefined, "next-auth.session-token=not-a-token", `next-auth.session-token.0=${inspector.cookie.length}; next-auth.session-token.1=x`]) {
      const res = await api<ErrorBody>(null, "GET", "/api/gallery", undefined, cookie ? { cookie } : {});
      expect(res.status).toBe(401);
      expect(res.body).toEqual(appRoute.body);
      expect(securityHeadersOf(res.headers)).toEqual(SECURITY_HEADERS);
    }
  });

  it("answers 400 naming the field to a query that does not parse, as the App Router routes do", async () => {
    const res = await api<ErrorBody>(inspector, "GET", "/api/gallery?limit=1000&grade=Z");
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("bad_request");
    expect(Object.keys(res.body.error.fieldErrors ?? {}).sort()).toEqual(["grade", "limit"]);
    expect((await api<ErrorBody>(inspector, "GET", "/api/gallery?colour=red")).body.error.message).toMatch(/Unknown field/);
  });

  it("leaves other methods to Next.js: a POST is checked as before (403 for an inspector, 400 for a lead's empty body); HEAD is answered", async () => {
    expect((await api<ErrorBody>(inspector, "POST", "/api/gallery", {})).status).toBe(403);
    expect((await api<ErrorBody>(lead, "POST", "/api/gallery", {})).status).toBe(400);
    expect((await fetch(`${BASE_URL}/api/gallery`, { method: "HEAD", headers: { cookie: inspector.cookie } })).status).toBe(200);
  });
});
