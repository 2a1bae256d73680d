import { hasAnyRole, type Role } from "@/lib/auth/roles";

export type Screen = {
  href: string;
  label: string;
  /** Who sees it in the navigation and may open it (leads see everything). */
  roles: readonly Role[];
  /** "planned" screens say what is coming and do nothing else yet. */
  status: "ready" | "planned";
  summary: string;
};

export const SCREENS: readonly Screen[] = [
  { href: "/queue", label: "Queue", roles: ["inspector"], status: "ready", summary: "Take the next unit that matters most, with a lease so no one else gets it." },
  { href: "/lots", label: "Lots", roles: ["inspector", "auditor"], status: "ready", summary: "Lots received from suppliers, their sampling plans, verdicts and dispositions." },
  { href: "/gallery", label: "Gallery", roles: ["inspector", "trainer", "auditor"], status: "planned", summary: "Reference examples of normal and abnormal parts per part type and defect class." },
  { href: "/calibration", label: "Calibration", roles: ["inspector", "trainer"], status: "planned", summary: "Calibration sets that graders grade, scored against the key." },
  { href: "/recheck", label: "Recheck", roles: ["auditor"], status: "planned", summary: "Blind re-grading of sampled units, agreement figures and adjudication." },
  { href: "/rubrics", label: "Rubrics", roles: ["trainer", "auditor"], status: "ready", summary: "Versioned grading rules per part type: drafts, publication, differences." },
  { href: "/suppliers", label: "Suppliers", roles: ["auditor"], status: "ready", summary: "Who sends the parts and where evidence goes." },
  // Everyone reads part types (the bench needs them); only leads edit them.
  { href: "/part-types", label: "Part types", roles: [], status: "ready", summary: "What each kind of part needs: views and zones to photograph, defect classes, the functional checklist." },
  { href: "/reports", label: "Reports", roles: ["auditor"], status: "planned", summary: "Lot reports, supplier scorecards, exports and condition certificates." },
  { href: "/people", label: "People", roles: ["lead"], status: "ready", summary: "Invite colleagues, give them roles, deactivate accounts." },
];

/** The Outbox is a development aid, listed only while mail goes to the local inbox. */
export const OUTBOX_SCREEN: Screen = {
  href: "/outbox",
  label: "Outbox",
  roles: ["lead"],
  status: "ready",
  summary: "E-mails the app sent, as the local inbox received them (development only).",
};

export function screensFor(roles: readonly Role[], { outbox }: { outbox: boolean }): Screen[] {
  const all = outbox ? [...SCREENS, OUTBOX_SCREEN] : SCREENS;
  return all.filter((s) => hasAnyRole(roles, s.roles));
}

export function screenByHref(href: string): Screen | undefined {
  return [...SCREENS, OUTBOX_SCREEN].find((s) => s.href === href);
}
