/**
 * Every API route with who may call it. api-access.test.ts checks that this table lists every
 * route handler in app/api (so a new route cannot skip the access tests) and then exercises
 * 401 / 403 / allowed / other-workspace for each entry.
 */
import { INSPECTION_READERS, type Role } from "@/lib/auth/roles";

export type RouteAccess = {
  method: "GET" | "POST" | "PATCH" | "PUT" | "DELETE";
  /** Path with :placeholders filled from fixtures (own workspace) or the other workspace. */
  path: string;
  /** "public": no session needed; "signed-in": any role; else the roles that pass (lead always passes). */
  access: "public" | "signed-in" | Role[];
  /** A body that passes validation, built fresh per call (unique e-mails and names); gets the fixture ids. */
  body?: (ids: Record<string, string>) => unknown;
  /** Status expected for an allowed caller with that body (several when it depends on data, e.g. 200 or 204). */
  allowedStatus: number | number[];
};

/** The inspection read paths: never auditors (blind recheck), see INSPECTION_READERS. */
const inspectionWork: Role[] = [...INSPECTION_READERS];
let n = 0;
const unique = (p: string) => `${p}-${Date.now().toString(36)}-${++n}`;

export const ROUTES: RouteAccess[] = [
  { method: "GET", path: "/api/health", access: "public", allowedStatus: 200 },
  // Sign-up only e-mails a confirmation link (202); the workspace comes when the link is used.
  { method: "POST", path: "/api/signup", access: "public", body: () => ({ companyName: unique("Route Check Works"), name: "Route Checker", email: `${unique("signup")}@tests.example` }), allowedStatus: 202 },
  { method: "POST", path: "/api/password/forgot", access: "public", body: () => ({ email: `${unique("nobody")}@tests.example` }), allowedStatus: 200 },
  // A well-formed but unknown token: the handler itself answers 400 "link not valid".
  { method: "POST", path: "/api/password/set", access: "public", body: () => ({ token: "x".repeat(43), password: "long-enough-password" }), allowedStatus: 400 },
  { method: "GET", path: "/api/me", access: "signed-in", allowedStatus: 200 },
  { method: "GET", path: "/api/workspace", access: "signed-in", allowedStatus: 200 },
  // The demo workspace has every starter already: nothing is created (201, created []).
  { method: "POST", path: "/api/part-types/starters", access: ["lead"], body: () => ({ slugs: ["battery"] }), allowedStatus: 201 },
  // Sets the default again, so the other tests' times stay in UTC.
  { method: "PATCH", path: "/api/workspace", access: ["lead"], body: () => ({ timeZone: "UTC" }), allowedStatus: 200 },
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
  // Rubrics (fixture part types have a published v1 and a draft v2; see tests/support/grading-access.ts).
  { method: "GET", path: "/api/part-types/:partTypeId/rubrics", access: "signed-in", allowedStatus: 200 },
  // The draft exists, so opening it again answers 200 with the same draft.
  { method: "POST", path: "/api/part-types/:partTypeId/rubrics", access: ["trainer"], allowedStatus: 200 },
  { method: "GET", path: "/api/part-types/:partTypeId/rubrics/draft", access: "signed-in", allowedStatus: 200 },
  // Every allowed caller names edit 0 of draft v2: the first saves (200), the later ones meet its save (409).
  { method: "PATCH", path: "/api/part-types/:partTypeId/rubrics/draft", access: ["trainer"], body: () => ({ rubric: { rules: [{ id: unique("route-check"), metric: "count", defect: "scratch", comparison: ">", threshold: 3, grade: "B" }] }, version: 2, revision: 0 }), allowedStatus: [200, 409] },
  { method: "GET", path: "/api/part-types/:partTypeId/rubrics/diff", access: "signed-in", allowedStatus: 200 },
  { method: "POST", path: "/api/part-types/:partTypeId/rubrics/preview", access: "signed-in", body: () => ({ rubric: { rules: [{ id: "preview", metric: "count", defect: "scratch", comparison: ">", threshold: 0, grade: "B" }] }, photos: [] }), allowedStatus: 200 },
  { method: "POST", path: "/api/part-types/:publishPartTypeId/rubrics/draft/publish", access: ["lead"], body: () => ({ version: 2, revision: 0 }), allowedStatus: 200 },
  // Grading (the fixture unit has a ready photo with regions, measured and graded once).
  { method: "POST", path: "/api/units/:unitId/measure", access: ["inspector"], allowedStatus: 200 },
  { method: "GET", path: "/api/units/:unitId/measure", access: inspectionWork, allowedStatus: 200 },
  { method: "GET", path: "/api/units/:unitId/grades", access: inspectionWork, allowedStatus: 200 },
  // The fixture unit is graded: a plain grade is refused (409) for anyone allowed (grade-integrity.test.ts covers overrides).
  { method: "POST", path: "/api/units/:unitId/grades", access: ["inspector"], body: () => ({ decision: "accept" }), allowedStatus: 409 },
  { method: "GET", path: "/api/units/:unitId/grade-preview", access: inspectionWork, allowedStatus: 200 },
  // Queue and leases (the fixture unit is queued, so renewing or releasing it is a 409 for anyone allowed).
  { method: "POST", path: "/api/queue/next", access: ["inspector"], body: () => ({ lotId: "00000000-0000-4000-8000-000000000000" }), allowedStatus: 204 },
  { method: "GET", path: "/api/queue", access: ["inspector"], allowedStatus: 200 },
  { method: "GET", path: "/api/queue/stats", access: ["inspector"], allowedStatus: 200 },
  { method: "PUT", path: "/api/units/:queuedUnitId/lease", access: ["inspector"], allowedStatus: 409 },
  { method: "DELETE", path: "/api/units/:queuedUnitId/lease", access: ["inspector"], allowedStatus: 409 },
  { method: "POST", path: "/api/units/:queuedUnitId/lease/reassign", access: ["lead"], body: (ids) => ({ userId: ids.inspectorId }), allowedStatus: 200 },
  // Photo intake (tests/support/photo-access.ts: a unit on the bench with one ready photo).
  { method: "GET", path: "/api/units/:photoUnitId/photos", access: inspectionWork, allowedStatus: 200 },
  // An intent stores nothing (no row, no object) until the browser uploads and finalises.
  { method: "POST", path: "/api/units/:photoUnitId/photos/uploads", access: ["inspector"], body: () => ({ viewKey: "front", fileName: "route-check.jpg", contentType: "image/jpeg", bytes: 1000 }), allowedStatus: 201 },
  // A well-formed but forged ticket: the handler itself answers 400 (real finalising is in photos.test.ts).
  { method: "POST", path: "/api/units/:photoUnitId/photos", access: ["inspector"], body: () => ({ ticket: `${"e30".repeat(8)}.${"x".repeat(43)}` }), allowedStatus: 400 },
  { method: "GET", path: "/api/photos/:photoId", access: inspectionWork, allowedStatus: 200 },
  // The fixture photo is ready: evidence is not dismissed, nothing to retry (both 409 for anyone allowed).
  { method: "DELETE", path: "/api/photos/:photoId", access: ["inspector"], allowedStatus: 409 },
  { method: "POST", path: "/api/photos/:photoId/retry", access: ["inspector"], allowedStatus: 409 },
  // Filing the fixture photo under its own view again changes nothing, but it is work on the unit: the
  // first allowed caller takes the waiting unit onto their bench (200), later ones meet that lease (409).
  { method: "PATCH", path: "/api/photos/:photoId", access: ["inspector"], body: () => ({ viewKey: "front" }), allowedStatus: [200, 409] },
  // A photo with saved regions on a unit the lead holds (tests/support/photo-access.ts): the lead withdraws
  // it (200, kept as a record); anyone else meets the lead's lease, or the photo already withdrawn (409).
  { method: "POST", path: "/api/photos/:removalPhotoId/removal", access: ["inspector"], body: () => ({ reason: "Route check: another unit's photo" }), allowedStatus: [200, 409] },
  { method: "GET", path: "/api/photos/:photoId/thumbnail", access: "signed-in", allowedStatus: 200 },
  { method: "GET", path: "/api/photos/:photoId/preview", access: "signed-in", allowedStatus: 200 },
  // A one-minute presigned GET of the untouched original.
  { method: "GET", path: "/api/photos/:photoId/original", access: "signed-in", allowedStatus: 302 },
  // Regions and suggestions on the Bench (tests/support/region-access.ts: a ready photo on a unit nobody holds).
  { method: "GET", path: "/api/photos/:regionPhotoId/regions", access: inspectionWork, allowedStatus: 200 },
  // Every allowed caller sends version 0: the first one saves (200) and takes the unit onto their bench; the later ones meet that lease or its save (409).
  { method: "PUT", path: "/api/photos/:regionPhotoId/regions", access: ["inspector"], body: () => ({ baseVersion: 0, regions: { regions: [{ id: "route-1", defect: "scratch", shape: { kind: "rect", x: 10, y: 10, width: 20, height: 10 } }], surfaces: [], ruler: null } }), allowedStatus: [200, 409] },
  { method: "POST", path: "/api/photos/:regionPhotoId/suggestions", access: ["inspector"], body: () => ({ kind: "surface" }), allowedStatus: 200 },
  // Part types, lots, units and checklists (tests/support/lot-access.ts).
  { method: "GET", path: "/api/part-types", access: "signed-in", allowedStatus: 200 },
  { method: "POST", path: "/api/part-types", access: ["lead"], body: () => ({ name: unique("Route part"), category: "other", views: [{ key: "front", label: "Front", required: true, zones: [] }], defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }], checklist: [] }), allowedStatus: 201 },
  { method: "GET", path: "/api/part-types/:lotPartTypeId", access: "signed-in", allowedStatus: 200 },
  { method: "PATCH", path: "/api/part-types/:editPartTypeId", access: ["lead"], body: () => ({ modelFamily: unique("Korvo") }), allowedStatus: 200 },
  { method: "GET", path: "/api/lots", access: ["inspector", "auditor"], allowedStatus: 200 },
  { method: "POST", path: "/api/lots", access: ["lead"], body: (ids) => ({ supplierId: ids.supplierId, partTypeId: ids.lotPartTypeId, purchaseRef: unique("PO-ROUTE"), quantity: 40, receivedOn: "2026-11-20", dueOn: "2026-11-25", inspectionLevel: "II", aqlCritical: null, aqlMajor: 1.0, aqlMinor: 2.5 }), allowedStatus: 201 },
  { method: "GET", path: "/api/lots/:lotId", access: ["inspector", "auditor"], allowedStatus: 200 },
  { method: "GET", path: "/api/lots/:lotId/units", access: ["inspector", "auditor"], allowedStatus: 200 },
  { method: "POST", path: "/api/lots/:emptyLotId/units", access: ["lead"], body: () => ({ source: "placeholders" }), allowedStatus: 201 },
  // The fixture battery lot has a swollen cell (critical, Re 1): rejected, so it may be returned.
  { method: "POST", path: "/api/lots/:decidableLotId/disposition", access: ["lead"], body: () => ({ disposition: "return_to_vendor", reason: "Route check: swollen cell." }), allowedStatus: 200 },
  { method: "GET", path: "/api/inspection-schemes?supplierId=:supplierId&partTypeId=:lotPartTypeId", access: ["inspector", "auditor"], allowedStatus: 200 },
  { method: "PUT", path: "/api/inspection-schemes", access: ["lead"], body: (ids) => ({ supplierId: ids.supplierId, partTypeId: ids.lotPartTypeId, steadyProduction: true }), allowedStatus: 200 },
  { method: "GET", path: "/api/units/:benchUnitId", access: inspectionWork, allowedStatus: 200 },
  { method: "PATCH", path: "/api/units/:serialUnitId", access: ["inspector"], body: () => ({ serial: unique("SN-ROUTE") }), allowedStatus: 200 },
  // The inspector's first result takes the queued unit onto their bench; the lead may still correct it.
  { method: "POST", path: "/api/units/:benchUnitId/checklist", access: ["inspector"], body: () => ({ itemId: "power", value: { pass: true } }), allowedStatus: 200 },
];

/** next-auth's own catch-all is public by nature and tested through sign-in. */
export const NOT_IN_TABLE = ["/api/auth/[...nextauth]"];
