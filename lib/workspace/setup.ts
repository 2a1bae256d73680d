/**
 * The first day of a workspace as steps, from its counts: what is done, and where to do the
 * next thing. The home page lists them; empty screens show the ones they depend on. Pure.
 */
import type { SetupCounts } from "@/db/queries/workspaces";

export type SetupStepKey = "part-types" | "rubrics" | "suppliers" | "people" | "lot";
export type SetupStep = { key: SetupStepKey; title: string; done: boolean; href: string; action: string; detail: string };

export function setupSteps(c: SetupCounts): SetupStep[] {
  return [
    {
      key: "part-types",
      title: "Part types",
      done: c.partTypes > 0,
      href: "/part-types",
      action: c.partTypes > 0 ? "Review the part types" : "Add part types",
      detail:
        c.partTypes > 0
          ? `${c.partTypes} active: their views, zones, defect classes and checklists are what the Bench asks for.`
          : "What you inspect: the views to photograph, their zones, the defect classes and the functional checklist. Start from the examples or make your own.",
    },
    {
      key: "rubrics",
      title: "Rubrics",
      done: c.partTypes > 0 && c.publishedRubrics >= c.partTypes,
      href: "/rubrics",
      action: c.draftRubrics > 0 ? "Adapt and publish the example rubrics" : "Write a rubric",
      detail:
        c.publishedRubrics > 0
          ? `${c.publishedRubrics} of ${c.partTypes} part types have a published rubric; units of the others cannot be graded yet.`
          : "A published rubric turns measured defects into a grade. Example rubrics are drafts: adapt their thresholds to your contracts, then publish.",
    },
    {
      key: "suppliers",
      title: "Suppliers",
      done: c.suppliers > 0,
      href: "/suppliers",
      action: "Add a supplier",
      detail:
        c.suppliers > 0
          ? `${c.suppliers} active. Lots come from a supplier; evidence packs go to its contact.`
          : "Lots come from a supplier, and evidence packs go to its contact. Set the grade its lots are bought at.",
    },
    {
      key: "people",
      title: "People",
      done: c.people > 1,
      href: "/people",
      action: "Invite your team",
      detail: c.people > 1 ? `${c.people} people in the workspace.` : "Invite inspectors, trainers and auditors; each gets an e-mail to set a password. Set the workspace's time zone there too.",
    },
    {
      key: "lot",
      title: "First lot",
      done: c.lots > 0,
      href: "/lots/new",
      action: "Receive a lot",
      detail: c.lots > 0 ? `${c.lots} received.` : "Receive a lot from a supplier: the sampling plan says how many units to inspect, and they wait in the Queue.",
    },
  ];
}
