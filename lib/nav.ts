import { can, type Permission } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";

export type Screen = {
  href: string;
  label: string;
  /**
   * The permission its page requires (lib/auth/permissions.ts): who sees it in the navigation and
   * may open it. API routes name their own permissions, so editing this table never changes them.
   */
  permission: Permission;
  /** "planned" marks a screen in the navigation that is not built yet (none today). */
  status: "ready" | "planned";
  summary: string;
};

export const SCREENS: readonly Screen[] = [
  { href: "/queue", label: "Queue", permission: "queue.work", status: "ready", summary: "Take the next unit that matters most, with a lease so no one else gets it." },
  { href: "/lots", label: "Lots", permission: "lots.read", status: "ready", summary: "Lots received from suppliers, their sampling plans, verdicts and dispositions." },
  { href: "/gallery", label: "Gallery", permission: "gallery.read", status: "ready", summary: "Reference examples of normal and abnormal parts per part type and defect class." },
  { href: "/calibration", label: "Calibration", permission: "calibration.read", status: "ready", summary: "Calibration sets that graders grade, scored against the key." },
  { href: "/recheck", label: "Recheck", permission: "recheck.perform", status: "ready", summary: "Blind re-grading of sampled units, agreement figures and adjudication." },
  { href: "/rubrics", label: "Rubrics", permission: "rubrics.review", status: "ready", summary: "Versioned grading rules per part type: drafts, publication, differences." },
  { href: "/suppliers", label: "Suppliers", permission: "suppliers.review", status: "ready", summary: "Who sends the parts and where evidence goes." },
  {
    href: "/part-types",
    label: "Part types",
    permission: "part-types.read",
    status: "ready",
    summary: "What each kind of part needs: views and zones to photograph, defect classes, the functional checklist.",
  },
  { href: "/reports", label: "Reports", permission: "reports.read", status: "ready", summary: "Lot reports, supplier scorecards, grade distribution, throughput and CSV exports." },
  { href: "/people", label: "People", permission: "people.manage", status: "ready", summary: "Invite colleagues, give them roles, deactivate accounts." },
];

/** The Outbox is a development aid, listed only while mail goes to the local inbox. */
export const OUTBOX_SCREEN: Screen = {
  href: "/outbox",
  label: "Outbox",
  permission: "outbox.read",
  status: "ready",
  summary: "E-mails the app sent, as the local inbox received them (development only).",
};

export function screensFor(roles: readonly Role[], { outbox }: { outbox: boolean }): Screen[] {
  const all = outbox ? [...SCREENS, OUTBOX_SCREEN] : SCREENS;
  return all.filter((s) => can({ roles }, s.permission));
}

export function screenByHref(href: string): Screen | undefined {
  return [...SCREENS, OUTBOX_SCREEN].find((s) => s.href === href);
}
