/**
 * The route access matrix (tests/integration/routes.ts, exercised by api-access.test.ts) covers
 * every route handler in app/api, and each handler names a permission from
 * lib/auth/permissions.ts (or says it is public) that its row repeats. Read from the source, so a
 * new route without a row or without a permission fails here, before any server starts.
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { isPermission } from "@/lib/auth/permissions";
import { NODE_ROUTES } from "@/lib/http/node-routes";
import { NOT_IN_TABLE, ROUTES } from "../../integration/routes";

/** The HTTP methods a route file exports, each with the access its `handler({ ... })` names (null: none named). */
function exportedAccess(source: string): Map<string, string | null> {
  const found = new Map<string, string | null>();
  for (const m of source.matchAll(/export (?:const|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)) found.set(m[1], null);
  for (const m of source.matchAll(/export \{([^}]+)\}/g)) for (const name of m[1].matchAll(/as (GET|POST|PUT|PATCH|DELETE)/g)) found.set(name[1], null);
  for (const m of source.matchAll(/export const (GET|POST|PUT|PATCH|DELETE) = handler\(\s*\{([^}]*)\}/g)) {
    const permission = /permission:\s*"([^"]+)"/.exec(m[2])?.[1];
    found.set(m[1], permission ?? (/public:\s*true/.test(m[2]) ? "public" : null));
  }
  return found;
}

/** Every route.ts under app/api with the HTTP methods it exports, as "/api/x/[id]" paths, and the access each names. */
function discoverRoutes(): { path: string; method: string; access: string | null }[] {
  const root = path.resolve("app/api");
  const found: { path: string; method: string; access: string | null }[] = [];
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.name === "route.ts") {
        const routePath = ("/api/" + path.relative(root, dir).split(path.sep).join("/")).replace(/\/$/, "");
        for (const [method, access] of exportedAccess(fs.readFileSync(full, "utf8"))) found.push({ path: routePath, method, access });
      }
    }
  };
  walk(root);
  return found;
}

// A query string is not part of the route (GET /api/inspection-schemes?supplierId=…).
const asTemplate = (p: string) => p.split("?")[0].replace(/:[a-zA-Z]+/g, "[id]");

describe("the route table", () => {
  const discovered = discoverRoutes().filter((r) => !NOT_IN_TABLE.includes(r.path));
  const key = (method: string, template: string) => `${method} ${template}`;

  it("lists every route handler and method in app/api, once, and nothing else", () => {
    const listed = ROUTES.map((r) => key(r.method, asTemplate(r.path)));
    const existing = new Set(discovered.map((r) => key(r.method, r.path)));
    expect(discovered.map((r) => key(r.method, r.path)).filter((k) => !listed.includes(k))).toEqual([]);
    expect(listed.filter((k) => !existing.has(k))).toEqual([]);
    expect(listed.filter((k, i) => listed.indexOf(k) !== i)).toEqual([]);
  });

  it("every route handler names a permission (or says it is public)", () => {
    expect(discovered.filter((r) => r.access === null || (r.access !== "public" && !isPermission(r.access))).map((r) => key(r.method, r.path))).toEqual([]);
  });

  it("each row states the permission its handler names", () => {
    const named = new Map(discovered.map((r) => [key(r.method, r.path), r.access]));
    const differing = ROUTES.filter((r) => named.get(key(r.method, asTemplate(r.path))) !== r.permission).map(
      (r) => `${key(r.method, r.path)}: table ${r.permission}, handler ${named.get(key(r.method, asTemplate(r.path)))}`,
    );
    expect(differing).toEqual([]);
  });

  it("each plain Node route of the production server has an App Router handler of the same path, method and permission", () => {
    // lib/http/node-routes.ts: `next dev` serves the App Router handler, the production server the plain route.
    const named = new Map(discovered.map((r) => [key(r.method, r.path), r.access]));
    expect(NODE_ROUTES.map((r) => `${key(r.method, r.path)}: ${named.get(key(r.method, r.path)) ?? "no handler"}`)).toEqual(NODE_ROUTES.map((r) => `${key(r.method, r.path)}: ${r.permission}`));
  });
});
