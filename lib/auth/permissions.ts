/**
 * What each role may do, by name. Route handlers (`handler({ permission })` in lib/http/route.ts),
 * pages (`requirePageUser({ permission })`), lib rules (`can`) and the navigation (lib/nav.ts) all
 * read this one table, and the route access matrix test (tests/integration/routes.ts) takes its
 * expected roles from it. Editing the menu never changes who may call an API: the API names its
 * own permission here.
 *
 * Leads hold every permission, so the table lists only the other roles. A new feature adds its
 * permissions here (with the reason the roles are what they are) instead of role lists in code.
 * Pure and free of server imports: client components may call `can` too.
 */
import { ROLE_LABELS, ROLES, type Role } from "./roles";

type NonLead = Exclude<Role, "lead">;
type Grant = { roles: readonly NonLead[]; what: string };

/** Every role of a workspace. */
const EVERYONE: readonly NonLead[] = ["inspector", "trainer", "auditor"];
/** Leads only. */
const LEADS: readonly NonLead[] = [];

export const PERMISSIONS = {
  // The workspace and its people.
  "workspace.read": { roles: EVERYONE, what: "read one's own account and the workspace's settings" },
  "workspace.manage": { roles: LEADS, what: "change the workspace's settings (its time zone)" },
  "people.manage": { roles: LEADS, what: "invite people, change their roles, deactivate accounts" },
  "outbox.read": { roles: LEADS, what: "read the Outbox (mail the app sent to the local inbox; a development aid)" },

  // Reference data. Everyone reads it through the API, because the Bench and the lot screens show it;
  // the screens that list it for review are narrower (`*.review`).
  "part-types.read": { roles: EVERYONE, what: "read part types: views, zones, defect classes, checklist" },
  "part-types.edit": { roles: LEADS, what: "create and edit part types, add the starter part types" },
  "suppliers.read": { roles: EVERYONE, what: "read suppliers and their contacts" },
  "suppliers.review": { roles: ["auditor"], what: "open the Suppliers screens" },
  "suppliers.edit": { roles: LEADS, what: "add and edit suppliers" },
  "rubrics.read": { roles: EVERYONE, what: "read rubric versions, the draft, their differences, and preview a rubric" },
  "rubrics.review": { roles: ["trainer", "auditor"], what: "open the Rubrics screen" },
  "rubrics.edit": { roles: ["trainer"], what: "open and save a rubric draft" },
  "rubrics.publish": { roles: LEADS, what: "publish a rubric draft" },

  // Lots and their decisions.
  "lots.read": { roles: ["inspector", "auditor"], what: "read lots, their units, sampling plans and verdicts" },
  "lots.manage": { roles: LEADS, what: "receive lots, add their units, set a supplier's inspection scheme" },
  "lots.decide": { roles: LEADS, what: "record a lot's disposition" },

  // The Bench.
  "queue.work": { roles: ["inspector"], what: "see the queue, take the next unit, renew and release one's own lease" },
  "leases.manage": { roles: LEADS, what: "hand a unit to another inspector, put back anyone's unit, correct a unit someone else holds" },
  /**
   * A unit's inspection work: its photos' details, regions, measurements, proposals, grades and
   * the Bench that shows them. Not auditors: a blind recheck must not see the first grader's
   * regions, grade, override reason or name; they will see graded work on the Recheck screens,
   * after their own grade. Trainers read it (view only): they promote a graded unit's photo into
   * the Gallery from its Bench, so they must see its regions and grade; they are never blind
   * re-checkers, and nothing they can do there changes a unit (no `units.record` or `regions.edit`).
   */
  "inspection.read": { roles: ["inspector", "trainer"], what: "read a unit's inspection work (the Bench)" },
  /** Only the image bytes; the photo's details and regions are `inspection.read`. */
  "photos.view": { roles: EVERYONE, what: "see photo images (thumbnail, preview, original)" },
  "photos.capture": { roles: ["inspector"], what: "upload, retry and remove a unit's photos" },
  "regions.edit": { roles: ["inspector"], what: "mark regions, ask for suggestions and measure a unit" },
  "units.record": { roles: ["inspector"], what: "record a unit's serial and checklist results" },
  "grades.record": { roles: ["inspector"], what: "record a unit's inspection grade" },
  "grades.override": { roles: LEADS, what: "override a recorded grade, with a reason" },

  // Screens still planned: their permissions are named now so that the features use names.
  "gallery.read": { roles: EVERYONE, what: "browse the Gallery and its reference panel on the Bench" },
  "gallery.edit": { roles: ["trainer"], what: "add, edit, publish and retire Gallery items" },
  /** Trainers curate what the model learns from (the Gallery), so they watch its figures and retrain it. */
  "suggestions.manage": { roles: ["trainer"], what: "see the learned-suggestion models with their held-out figures, and start a training" },
  "calibration.read": { roles: ["inspector", "trainer"], what: "open the Calibration screen" },
  "calibration.take": { roles: ["inspector"], what: "take an assigned calibration set" },
  "calibration.manage": { roles: ["trainer"], what: "assemble calibration sets, assign them and see every attempt" },
  "recheck.perform": { roles: ["auditor"], what: "take and submit blind rechecks" },
  "recheck.adjudicate": { roles: ["auditor"], what: "settle a disagreement between a grade and its recheck" },
  "reports.read": { roles: ["auditor"], what: "read reports, scorecards and exports" },
  "evidence.send": { roles: LEADS, what: "send a supplier evidence pack and follow its claim" },
  /** A certificate vouches to a buyer for a unit's condition in the workspace's name: leads only. */
  "certificates.manage": { roles: LEADS, what: "issue, download and revoke condition certificates of graded units" },
} as const satisfies Record<string, Grant>;

export type Permission = keyof typeof PERMISSIONS;

export function isPermission(value: unknown): value is Permission {
  return typeof value === "string" && Object.hasOwn(PERMISSIONS, value);
}

/** The roles that hold a permission, leads included, in the order of ROLES. */
export function holders(permission: Permission): Role[] {
  const listed: readonly Role[] = PERMISSIONS[permission].roles;
  return ROLES.filter((r) => r === "lead" || listed.includes(r));
}

/** True when any of the user's roles holds the permission. */
export function can(user: { roles: readonly Role[] }, permission: Permission): boolean {
  const allowed = holders(permission);
  return user.roles.some((r) => allowed.includes(r));
}

/** "Inspector or Auditor": the roles to name in a 403 (leads only when no other role holds it). */
export function describeHolders(permission: Permission): string {
  const listed: readonly Role[] = PERMISSIONS[permission].roles;
  return (listed.length ? listed : (["lead"] as const)).map((r) => ROLE_LABELS[r]).join(" or ");
}
