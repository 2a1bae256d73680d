/**
 * Every API route with who may call it. api-access.test.ts checks that this table lists every
 * route handler in app/api (so a new route cannot skip the access tests) and then exercises
 * 401 / 403 / allowed / other-workspace for each entry.
 */
import type { Role } from "@/lib/auth/roles";

export type RouteAccess = {
  method: "GET" | "POST" | "PATCH" | "PUT" | "DELETE";
  /** Path with :placeholders filled from fixtures (own workspace) or the other workspace. */
  path: string;
  /** "public": no session needed; "signed-in": any role; else the roles that pass (lead always passes). */
  access: "public" | "signed-in" | Role[];
  /** A body that passes validation, built fresh per call (unique e-mails and names). */
  body?: () => unknown;
  /** Status expected for an allowed caller with that body. */
  allowedStatus: number;
};

let n = 0;
const unique = (p: string) => `${p}-${Date.now().toString(36)}-${++n}`;

export const ROUTES: RouteAccess[] = [
  { method: "GET", path: "/api/health", access: "public", allowedStatus: 200 },
  { method: "POST", path: "/api/signup", access: "public", body: () => ({ companyName: unique("Route Check Works"), name: "Route Checker", email: `${unique("signup")}@tests.example`, password: "long-enough-password" }), allowedStatus: 201 },
  { method: "POST", path: "/api/password/forgot", access: "public", body: () => ({ email: "nobody@tests.example" }), allowedStatus: 200 },
  // A well-formed but unknown token: the handler itself answers 400 "link not valid".
  { method: "POST", path: "/api/password/set", access: "public", body: () => ({ token: "x".repeat(43), password: "long-enough-password" }), allowedStatus: 400 },
  { method: "GET", path: "/api/me", access: "signed-in", allowedStatus: 200 },
  { method: "GET", path: "/api/people", access: ["lead"], allowedStatus: 200 },
  { method: "POST", path: "/api/people", access: ["lead"], body: () => ({ email: `${unique("invitee")}@tests.example`, name: "Route Invitee", roles: ["inspector"] }), allowedStatus: 201 },
  { method: "GET", path: "/api/people/:personId", access: ["lead"], allowedStatus: 200 },
  { method: "PATCH", path: "/api/people/:personId", access: ["lead"], body: () => ({ name: "Renamed By Route Check" }), allowedStatus: 200 },
  { method: "POST", path: "/api/people/:invitedPersonId/invitation", access: ["lead"], allowedStatus: 200 },
  { method: "GET", path: "/api/suppliers", access: "signed-in", allowedStatus: 200 },
  { method: "POST", path: "/api/suppliers", access: ["lead"], body: () => ({ name: unique("Route Supplier"), contactEmail: "route@supplier.example" }), allowedStatus: 201 },
  { method: "GET", path: "/api/suppliers/:supplierId", access: "signed-in", allowedStatus: 200 },
  { method: "PATCH", path: "/api/suppliers/:supplierId", access: ["lead"], body: () => ({ notes: unique("checked") }), allowedStatus: 200 },
  { method: "GET", path: "/api/outbox", access: ["lead"], allowedStatus: 200 },
  { method: "GET", path: "/api/outbox/:emailId", access: ["lead"], allowedStatus: 200 },
];

/** next-auth's own catch-all is public by nature and tested through sign-in. */
export const NOT_IN_TABLE = ["/api/auth/[...nextauth]"];
