/**
 * Every API route with the permission its handler names. tests/unit/http/route-table.test.ts
 * checks that this table lists every route handler in app/api and that each row's permission is
 * the one its handler names (`handler({ permission })`, lib/http/route.ts); api-access.test.ts
 * then exercises 401 / 403 / allowed / other-workspace for each entry, the allowed roles read
 * from lib/auth/permissions.ts.
 */
import type { Permission } from "@/lib/auth/permissions";

export type RouteRow = {
  method: "GET" | "POST" | "PATCH" | "PUT" | "DELETE";
  /** Path with :placeholders filled from fixtures (own workspace) or the other workspace. */
  path: string;
  /** The permission its handler names, or "public" (no session needed). Its holders pass, everyone else gets 403. */
  permission: Permission | "public";
  /** A body that passes validation, built fresh per call (unique e-mails and names); gets the fixture ids. */
  body?: (ids: Record<string, string>) => unknown;
  /** Status expected for an allowed caller with that body (several when it depends on data, e.g. 200 or 204). */
  allowedStatus: number | number[];
};

let n = 0;
const unique = (p: string) => `${p}-${Date.now().toString(36)}-${++n}`;

export const ROUTES: RouteRow[] = [
  { method: "GET", path: "/api/health", permission: "public", allowedStatus: 200 },
  // Sign-up only e-mails a confirmation link (202); the workspace comes when the link is used.
  {
    method: "POST",
    path: "/api/signup",
    permission: "public",
    body: () => ({ companyName: unique("Route Check Works"), name: "Route Checker", email: `${unique("signup")}@tests.example` }),
    allowedStatus: 202,
  },
  { method: "POST", path: "/api/password/forgot", permission: "public", body: () => ({ email: `${unique("nobody")}@tests.example` }), allowedStatus: 200 },
  // A well-formed but unknown token: the handler itself answers 400 "link not valid".
  { method: "POST", path: "/api/password/set", permission: "public", body: () => ({ token: "x".repeat(43), password: "long-enough-password" }), allowedStatus: 400 },
  { method: "GET", path: "/api/me", permission: "workspace.read", allowedStatus: 200 },
  { method: "GET", path: "/api/workspace", permission: "workspace.read", allowedStatus: 200 },
  // The demo workspace has every starter already: nothing is created (201, created []).
  { method: "POST", path: "/api/part-types/starters", permission: "part-types.edit", body: () => ({ slugs: ["battery"] }), allowedStatus: 201 },
  { method: "GET", path: "/api/part-types/:partTypeId/sample-photos?view=lens", permission: "part-types.edit", allowedStatus: 200 },
  // Sets the default again, so the other tests' times stay in UTC.
  { method: "PATCH", path: "/api/workspace", permission: "workspace.manage", body: () => ({ timeZone: "UTC" }), allowedStatus: 200 },
  { method: "GET", path: "/api/people", permission: "people.manage", allowedStatus: 200 },
  { method: "POST", path: "/api/people", permission: "people.manage", body: () => ({ email: `${unique("invitee")}@tests.example`, name: "Route Invitee", roles: ["inspector"] }), allowedStatus: 201 },
  { method: "GET", path: "/api/people/:personId", permission: "people.manage", allowedStatus: 200 },
  { method: "PATCH", path: "/api/people/:personId", permission: "people.manage", body: () => ({ name: "Renamed By Route Check" }), allowedStatus: 200 },
  { method: "POST", path: "/api/people/:invitedPersonId/invitation", permission: "people.manage", allowedStatus: 200 },
  { method: "GET", path: "/api/suppliers", permission: "suppliers.read", allowedStatus: 200 },
  { method: "POST", path: "/api/suppliers", permission: "suppliers.edit", body: () => ({ name: unique("Route Supplier"), contactEmail: "route@supplier.example" }), allowedStatus: 201 },
  { method: "GET", path: "/api/suppliers/:supplierId", permission: "suppliers.read", allowedStatus: 200 },
  { method: "PATCH", path: "/api/suppliers/:supplierId", permission: "suppliers.edit", body: () => ({ notes: unique("checked") }), allowedStatus: 200 },
  { method: "GET", path: "/api/outbox", permission: "outbox.read", allowedStatus: 200 },
  { method: "GET", path: "/api/outbox/:emailId", permission: "outbox.read", allowedStatus: 200 },
  // Rubrics (fixture part types have a published v1 and a draft v2; see tests/support/grading-access.ts).
  { method: "GET", path: "/api/part-types/:partTypeId/rubrics", permission: "rubrics.read", allowedStatus: 200 },
  // The draft exists, so opening it again answers 200 with the same draft.
  { method: "POST", path: "/api/part-types/:partTypeId/rubrics", permission: "rubrics.edit", allowedStatus: 200 },
  { method: "GET", path: "/api/part-types/:partTypeId/rubrics/draft", permission: "rubrics.read", allowedStatus: 200 },
  // Every allowed caller names edit 0 of draft v2: the first saves (200), the later ones meet its save (409).
  {
    method: "PATCH",
    path: "/api/part-types/:partTypeId/rubrics/draft",
    permission: "rubrics.edit",
    body: () => ({ rubric: { rules: [{ id: unique("route-check"), metric: "count", defect: "scratch", comparison: ">", threshold: 3, grade: "B" }] }, version: 2, revision: 0 }),
    allowedStatus: [200, 409],
  },
  { method: "GET", path: "/api/part-types/:partTypeId/rubrics/diff", permission: "rubrics.read", allowedStatus: 200 },
  {
    method: "POST",
    path: "/api/part-types/:partTypeId/rubrics/preview",
    permission: "rubrics.read",
    body: () => ({ rubric: { rules: [{ id: "preview", metric: "count", defect: "scratch", comparison: ">", threshold: 0, grade: "B" }] }, photos: [] }),
    allowedStatus: 200,
  },
  { method: "POST", path: "/api/part-types/:publishPartTypeId/rubrics/draft/publish", permission: "rubrics.publish", body: () => ({ version: 2, revision: 0 }), allowedStatus: 200 },
  // Grading (the fixture unit has a ready photo with regions, measured and graded once).
  { method: "POST", path: "/api/units/:unitId/measure", permission: "regions.edit", allowedStatus: 200 },
  { method: "GET", path: "/api/units/:unitId/measure", permission: "inspection.read", allowedStatus: 200 },
  { method: "GET", path: "/api/units/:unitId/grades", permission: "inspection.read", allowedStatus: 200 },
  // The fixture unit is graded: a plain grade is refused (409) for anyone allowed (grade-integrity.test.ts covers overrides).
  { method: "POST", path: "/api/units/:unitId/grades", permission: "grades.record", body: () => ({ decision: "accept" }), allowedStatus: 409 },
  { method: "GET", path: "/api/units/:unitId/grade-preview", permission: "inspection.read", allowedStatus: 200 },
  // Queue and leases (the fixture unit is queued, so renewing or releasing it is a 409 for anyone allowed).
  { method: "POST", path: "/api/queue/next", permission: "queue.work", body: () => ({ lotId: "00000000-0000-4000-8000-000000000000" }), allowedStatus: 204 },
  { method: "GET", path: "/api/queue", permission: "queue.work", allowedStatus: 200 },
  { method: "GET", path: "/api/queue/stats", permission: "queue.work", allowedStatus: 200 },
  { method: "PUT", path: "/api/units/:queuedUnitId/lease", permission: "queue.work", allowedStatus: 409 },
  { method: "DELETE", path: "/api/units/:queuedUnitId/lease", permission: "queue.work", allowedStatus: 409 },
  { method: "POST", path: "/api/units/:queuedUnitId/lease/reassign", permission: "leases.manage", body: (ids) => ({ userId: ids.inspectorId }), allowedStatus: 200 },
  // Photo intake (tests/support/photo-access.ts: a unit on the bench with one ready photo).
  { method: "GET", path: "/api/units/:photoUnitId/photos", permission: "inspection.read", allowedStatus: 200 },
  // An intent stores nothing (no row, no object) until the browser uploads and finalises.
  {
    method: "POST",
    path: "/api/units/:photoUnitId/photos/uploads",
    permission: "photos.capture",
    body: () => ({ viewKey: "front", fileName: "route-check.jpg", contentType: "image/jpeg", bytes: 1000 }),
    allowedStatus: 201,
  },
  // A well-formed but forged ticket: the handler itself answers 400 (real finalising is in photos.test.ts).
  { method: "POST", path: "/api/units/:photoUnitId/photos", permission: "photos.capture", body: () => ({ ticket: `${"e30".repeat(8)}.${"x".repeat(43)}` }), allowedStatus: 400 },
  { method: "GET", path: "/api/photos/:photoId", permission: "inspection.read", allowedStatus: 200 },
  // The fixture photo is ready: evidence is not dismissed, nothing to retry (both 409 for anyone allowed).
  { method: "DELETE", path: "/api/photos/:photoId", permission: "photos.capture", allowedStatus: 409 },
  { method: "POST", path: "/api/photos/:photoId/retry", permission: "photos.capture", allowedStatus: 409 },
  // Filing the fixture photo under its own view again changes nothing, but it is work on the unit: the
  // first allowed caller takes the waiting unit onto their bench (200), later ones meet that lease (409).
  { method: "PATCH", path: "/api/photos/:photoId", permission: "photos.capture", body: () => ({ viewKey: "front" }), allowedStatus: [200, 409] },
  // A photo with saved regions on a unit the lead holds (tests/support/photo-access.ts): the lead withdraws
  // it (200, kept as a record); anyone else meets the lead's lease, or the photo already withdrawn (409).
  { method: "POST", path: "/api/photos/:removalPhotoId/removal", permission: "photos.capture", body: () => ({ reason: "Route check: another unit's photo" }), allowedStatus: [200, 409] },
  { method: "GET", path: "/api/photos/:photoId/thumbnail", permission: "photos.view", allowedStatus: 200 },
  { method: "GET", path: "/api/photos/:photoId/preview", permission: "photos.view", allowedStatus: 200 },
  // A one-minute presigned GET of the untouched original.
  { method: "GET", path: "/api/photos/:photoId/original", permission: "photos.view", allowedStatus: 302 },
  // Regions and suggestions on the Bench (tests/support/region-access.ts: a ready photo on a unit nobody holds).
  { method: "GET", path: "/api/photos/:regionPhotoId/regions", permission: "inspection.read", allowedStatus: 200 },
  // Every allowed caller sends version 0: the first one saves (200) and takes the unit onto their bench; the later ones meet that lease or its save (409).
  {
    method: "PUT",
    path: "/api/photos/:regionPhotoId/regions",
    permission: "regions.edit",
    body: () => ({ baseVersion: 0, regions: { regions: [{ id: "route-1", defect: "scratch", shape: { kind: "rect", x: 10, y: 10, width: 20, height: 10 } }], surfaces: [], ruler: null } }),
    allowedStatus: [200, 409],
  },
  { method: "POST", path: "/api/photos/:regionPhotoId/suggestions", permission: "regions.edit", body: () => ({ kind: "surface" }), allowedStatus: 200 },
  // Learned ghosts and the record of decisions (tests/support/suggestion-access.ts): only where the caller may mark now,
  // so a caller meeting the lease the region save above gave its first caller gets 409, as that save does.
  { method: "POST", path: "/api/photos/:regionPhotoId/learned-suggestions", permission: "regions.edit", body: () => ({}), allowedStatus: [200, 409] },
  {
    method: "POST",
    path: "/api/photos/:regionPhotoId/suggestion-decisions",
    permission: "regions.edit",
    body: (ids) => ({ modelId: ids.suggestionModelId, decisions: [{ defect: "scratch", shape: { kind: "spot", x: 40, y: 40, radius: 4 }, score: 0.5, decision: "dismissed" }] }),
    allowedStatus: [201, 409],
  },
  // Part types, lots, units and checklists (tests/support/lot-access.ts).
  { method: "GET", path: "/api/part-types", permission: "part-types.read", allowedStatus: 200 },
  {
    method: "POST",
    path: "/api/part-types",
    permission: "part-types.edit",
    body: () => ({
      name: unique("Route part"),
      category: "other",
      views: [{ key: "front", label: "Front", required: true, zones: [] }],
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
      checklist: [],
    }),
    allowedStatus: 201,
  },
  { method: "GET", path: "/api/part-types/:lotPartTypeId", permission: "part-types.read", allowedStatus: 200 },
  { method: "PATCH", path: "/api/part-types/:editPartTypeId", permission: "part-types.edit", body: () => ({ modelFamily: unique("Korvo") }), allowedStatus: 200 },
  { method: "GET", path: "/api/lots", permission: "lots.read", allowedStatus: 200 },
  {
    method: "POST",
    path: "/api/lots",
    permission: "lots.manage",
    body: (ids) => ({
      supplierId: ids.supplierId,
      partTypeId: ids.lotPartTypeId,
      purchaseRef: unique("PO-ROUTE"),
      quantity: 40,
      receivedOn: "2026-11-20",
      dueOn: "2026-11-25",
      inspectionLevel: "II",
      aqlCritical: null,
      aqlMajor: 1.0,
      aqlMinor: 2.5,
    }),
    allowedStatus: 201,
  },
  { method: "GET", path: "/api/lots/:lotId", permission: "lots.read", allowedStatus: 200 },
  { method: "GET", path: "/api/lots/:lotId/units", permission: "lots.read", allowedStatus: 200 },
  // Reports (issue 17): the lot report PDF and the CSV exports (a filter naming another workspace's supplier is a 404).
  { method: "GET", path: "/api/lots/:lotId/report", permission: "reports.read", allowedStatus: 200 },
  // Condition certificates: the fixture unit is graded; issuing answers 201, or 409 while its serial is missing.
  { method: "GET", path: "/api/units/:unitId/certificates", permission: "certificates.manage", allowedStatus: 200 },
  { method: "POST", path: "/api/units/:unitId/certificates", permission: "certificates.manage", body: () => ({}), allowedStatus: [201, 409] },
  // The fixture certificate (tests/support/certificate-access.ts); revoking it twice answers 409.
  { method: "GET", path: "/api/certificates/:certificateId/pdf", permission: "certificates.manage", allowedStatus: 200 },
  { method: "POST", path: "/api/certificates/:certificateId/revoke", permission: "certificates.manage", body: () => ({ reason: "Route check." }), allowedStatus: [200, 409] },
  { method: "GET", path: "/api/reports/export?kind=defects&supplierId=:supplierId", permission: "reports.read", allowedStatus: 200 },
  // Evidence packs and claims: the fixture lot is open, so preview and send answer 409 (nothing is sent); evidence.test.ts covers the rest.
  { method: "GET", path: "/api/lots/:lotId/evidence", permission: "evidence.send", allowedStatus: 200 },
  { method: "POST", path: "/api/lots/:lotId/evidence/preview", permission: "evidence.send", body: () => ({ subject: "Lot {{lot}}", body: "Route check." }), allowedStatus: 409 },
  { method: "POST", path: "/api/lots/:lotId/evidence", permission: "evidence.send", body: () => ({ subject: "Lot {{lot}}", body: "Route check." }), allowedStatus: 409 },
  { method: "GET", path: "/api/suppliers/:supplierId/evidence", permission: "evidence.send", allowedStatus: 200 },
  // The fixture pack (tests/support/evidence-access.ts): its claim at version 1 moves once (a later caller's version is stale: 409); its link is withdrawn once (then 409).
  { method: "PATCH", path: "/api/claims/:claimId", permission: "evidence.send", body: () => ({ status: "closed", note: "Route check.", version: 1 }), allowedStatus: [200, 409] },
  { method: "POST", path: "/api/evidence-packs/:evidencePackId/revoke", permission: "evidence.send", body: () => ({}), allowedStatus: [200, 409] },
  // Public: a file behind an evidence link; a token that is not one gets the plain refusal (404). evidence-link.test.ts opens real ones.
  { method: "GET", path: "/api/evidence-links/:evidenceLinkToken?file=0", permission: "public", allowedStatus: 404 },
  { method: "POST", path: "/api/lots/:emptyLotId/units", permission: "lots.manage", body: () => ({ source: "placeholders" }), allowedStatus: 201 },
  // The fixture battery lot has a swollen cell (critical, Re 1): rejected, so it may be returned.
  {
    method: "POST",
    path: "/api/lots/:decidableLotId/disposition",
    permission: "lots.decide",
    body: () => ({ disposition: "return_to_vendor", reason: "Route check: swollen cell." }),
    allowedStatus: 200,
  },
  { method: "GET", path: "/api/inspection-schemes?supplierId=:supplierId&partTypeId=:lotPartTypeId", permission: "lots.read", allowedStatus: 200 },
  {
    method: "PUT",
    path: "/api/inspection-schemes",
    permission: "lots.manage",
    body: (ids) => ({ supplierId: ids.supplierId, partTypeId: ids.lotPartTypeId, steadyProduction: true }),
    allowedStatus: 200,
  },
  { method: "GET", path: "/api/units/:benchUnitId", permission: "inspection.read", allowedStatus: 200 },
  { method: "PATCH", path: "/api/units/:serialUnitId", permission: "units.record", body: () => ({ serial: unique("SN-ROUTE") }), allowedStatus: 200 },
  // The inspector's first result takes the queued unit onto their bench; the lead may still correct it.
  { method: "POST", path: "/api/units/:benchUnitId/checklist", permission: "units.record", body: () => ({ itemId: "power", value: { pass: true } }), allowedStatus: 200 },
  // Gallery (tests/support/gallery-access.ts: a graded unit's photo to promote, a published item, three drafts).
  { method: "GET", path: "/api/gallery", permission: "gallery.read", allowedStatus: 200 },
  // The first allowed caller promotes the photo (201); the later ones find it already in the gallery (409).
  { method: "POST", path: "/api/gallery", permission: "gallery.edit", body: (ids) => ({ photoId: ids.promotablePhotoId }), allowedStatus: [201, 409] },
  { method: "GET", path: "/api/gallery/:galleryItemId", permission: "gallery.read", allowedStatus: 200 },
  // Learned suggestions (tests/support/suggestion-access.ts: the workspace's latest training job).
  { method: "GET", path: "/api/suggestion-models", permission: "suggestions.manage", allowedStatus: 200 },
  { method: "POST", path: "/api/suggestion-models", permission: "suggestions.manage", body: () => ({}), allowedStatus: 202 },
  { method: "GET", path: "/api/suggestion-models/jobs/:trainingJobId", permission: "suggestions.manage", allowedStatus: 200 },
  // Every allowed caller names revision 0: the first saves (200), the later ones meet its save (409).
  { method: "PATCH", path: "/api/gallery/:galleryDraftId", permission: "gallery.edit", body: () => ({ revision: 0, caption: unique("Route check caption") }), allowedStatus: [200, 409] },
  { method: "POST", path: "/api/gallery/:galleryPublishId/publish", permission: "gallery.edit", body: () => ({ revision: 0 }), allowedStatus: [200, 409] },
  { method: "POST", path: "/api/gallery/:galleryRetireId/retire", permission: "gallery.edit", body: () => ({ revision: 0 }), allowedStatus: [200, 409] },
  { method: "GET", path: "/api/gallery/:galleryItemId/measurement", permission: "gallery.read", allowedStatus: 200 },
  { method: "GET", path: "/api/gallery/reference?partType=:galleryPartTypeId&view=lens", permission: "gallery.read", allowedStatus: 200 },
  // An intent stores nothing until the browser uploads and finalises.
  {
    method: "POST",
    path: "/api/gallery/uploads",
    permission: "gallery.edit",
    body: (ids) => ({ partTypeId: ids.galleryPartTypeId, viewKey: "lens", kind: "normal", grade: "A", fileName: "route-check.jpg", contentType: "image/jpeg", bytes: 1000 }),
    allowedStatus: 201,
  },
  // A well-formed but forged ticket: the handler itself answers 400 (real finalising is in gallery-photos.test.ts).
  { method: "POST", path: "/api/gallery/photos", permission: "gallery.edit", body: () => ({ ticket: `${"e30".repeat(8)}.${"x".repeat(43)}` }), allowedStatus: 400 },
  // Calibration (tests/support/calibration-access.ts: five published items, a set of them assigned to the lead, the lead's attempt started).
  { method: "GET", path: "/api/calibration/sets", permission: "calibration.manage", allowedStatus: 200 },
  {
    method: "POST",
    path: "/api/calibration/sets",
    permission: "calibration.manage",
    body: (ids) => ({ name: unique("Route check set"), itemIds: ids.calibrationItemIds.split(",") }),
    allowedStatus: 201,
  },
  { method: "GET", path: "/api/calibration/sets/:calibrationSetId", permission: "calibration.manage", allowedStatus: 200 },
  {
    method: "POST",
    path: "/api/calibration/sets/:calibrationSetId/assignments",
    permission: "calibration.manage",
    body: (ids) => ({ userIds: [ids.calibrationTakerId], dueOn: "2099-12-31" }),
    allowedStatus: 200,
  },
  { method: "GET", path: "/api/calibration/assignments", permission: "calibration.take", allowedStatus: 200 },
  // The fixture's assignment and attempt are the lead's: the other takers meet them as missing ones (404; their own are in calibration.test.ts).
  { method: "POST", path: "/api/calibration/assignments/:calibrationAssignmentId/attempt", permission: "calibration.take", allowedStatus: [200, 404] },
  { method: "GET", path: "/api/calibration/attempts/:calibrationAttemptId", permission: "calibration.take", allowedStatus: [200, 404] },
  {
    method: "PUT",
    path: "/api/calibration/attempts/:calibrationAttemptId/answers",
    permission: "calibration.take",
    body: () => ({ position: 1, grade: "C", regions: { regions: [], surfaces: [], ruler: null } }),
    allowedStatus: [200, 404],
  },
  { method: "GET", path: "/api/calibration/attempts/:calibrationAttemptId/image?position=1", permission: "calibration.take", allowedStatus: [200, 404] },
  { method: "GET", path: "/api/calibration/attempts/:calibrationAttemptId/measurement?position=1", permission: "calibration.take", allowedStatus: [200, 404] },
  // Four items have no grade yet: the lead's submit is refused (409); scoring itself is in calibration.test.ts.
  { method: "POST", path: "/api/calibration/attempts/:calibrationAttemptId/submit", permission: "calibration.take", allowedStatus: [409, 404] },
  // Recheck (issue 19). The grading fixture unit is graded: the first allowed caller sends it (201), later ones find it sent (409).
  { method: "POST", path: "/api/rechecks", permission: "recheck.perform", body: (ids) => ({ unitId: ids.unitId }), allowedStatus: [201, 409] },
  { method: "GET", path: "/api/workspace/recheck-settings", permission: "workspace.read", allowedStatus: 200 },
  // The defaults again, so other tests draw as usual.
  {
    method: "PUT",
    path: "/api/workspace/recheck-settings",
    permission: "workspace.manage",
    body: () => ({ rate: 0.05, raisedRate: 0.2, minimumPerGrader: 1, iouThreshold: 0.5, meaningfulShare: 0.0005, meaningfulPx: 100, driftAgreement: 0.8, driftWeeks: 4, driftMinRechecks: 5 }),
    allowedStatus: 200,
  },
  // The recheck fixture (tests/support/recheck-access.ts) waits, held by nobody: work on it is 409 for anyone allowed.
  { method: "GET", path: "/api/rechecks/:recheckId", permission: "recheck.perform", allowedStatus: 409 },
  { method: "PUT", path: "/api/rechecks/:recheckId/lease", permission: "recheck.perform", allowedStatus: 409 },
  { method: "DELETE", path: "/api/rechecks/:recheckId/lease", permission: "recheck.perform", allowedStatus: 409 },
  {
    method: "PUT",
    path: "/api/rechecks/:recheckId/regions",
    permission: "recheck.perform",
    body: (ids) => ({ photoId: ids.recheckPhotoId, baseVersion: 0, regions: { regions: [], surfaces: [], ruler: null } }),
    allowedStatus: 409,
  },
  { method: "POST", path: "/api/rechecks/:recheckId/measure", permission: "recheck.perform", allowedStatus: 409 },
  { method: "POST", path: "/api/rechecks/:recheckId/submission", permission: "recheck.perform", body: () => ({ decision: "accept", proposedGrade: "A" }), allowedStatus: 409 },
  { method: "GET", path: "/api/rechecks/adjudications", permission: "recheck.adjudicate", allowedStatus: 200 },
  // Not submitted yet: nothing to settle (404 to look at, 409 to decide).
  { method: "GET", path: "/api/rechecks/:recheckId/adjudication", permission: "recheck.adjudicate", allowedStatus: 404 },
  { method: "POST", path: "/api/rechecks/:recheckId/adjudication", permission: "recheck.adjudicate", body: () => ({ choice: "first", reason: "Route check." }), allowedStatus: 409 },
  { method: "GET", path: "/api/recheck/scorecards", permission: "reports.read", allowedStatus: 200 },
  { method: "GET", path: "/api/recheck/scorecards/csv", permission: "reports.read", allowedStatus: 200 },
  // Last of the recheck rows: the first allowed caller takes the fixture recheck (200), later ones find nothing for them (204).
  { method: "POST", path: "/api/rechecks/next", permission: "recheck.perform", allowedStatus: [200, 204] },
];

/** next-auth's own catch-all is public by nature and tested through sign-in. */
export const NOT_IN_TABLE = ["/api/auth/[...nextauth]"];
