/**
 * Example rubrics for the seeded part types. EXAMPLES TO ADAPT: every threshold below is
 * (c) common practice / invented example — not taken from a standard or a vendor; a company's
 * own policy, supplier contracts and local regulations decide. Keys match example-part-types.ts.
 *
 * Pattern: B = visible but light wear, C = clearly worn but working, Reject = unsafe, broken or
 * not resellable. Functional failures: any critical → Reject, any major → C, minor → B.
 */
import type { ExamplePartTypeSlug } from "./example-part-types";
import type { Rubric, Rule } from "./rubric-schema";

const EXAMPLE_NOTE = "Example rubric to adapt: thresholds are (c) common practice / invented examples, not from a standard.";
const STATIC_NOTE = "Static-sensitive part: handle on an ESD-safe mat with a grounded wrist strap.";
export const BATTERY_CAUTION = "Swollen, punctured or hot lithium cells are a fire risk: isolate in a fire-safe container, do not charge or press; follow local hazardous-waste and transport rules.";
const DEFER_NOTE = "Grades are decision aids; company policy, supplier contracts and local regulations decide.";

/** Functional checklist failures, the same ladder on every example (c). */
const functionalRules = (prefix: string, minorAllowed = 0): Rule[] => [
  { id: `${prefix}-func-critical`, metric: "functionalFailures", severity: "critical", comparison: ">", threshold: 0, grade: "Reject" },
  { id: `${prefix}-func-major`, metric: "functionalFailures", severity: "major", comparison: ">", threshold: 0, grade: "C" },
  { id: `${prefix}-func-minor`, metric: "functionalFailures", severity: "minor", comparison: ">", threshold: minorAllowed, grade: "B" },
];

/** Camera modules: the lens window is optical, so any mark there weighs more than on the body (c). */
const cameraRules = (prefix: string): Rule[] => [
  { id: `${prefix}-lens-scratch-b`, metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.2, grade: "B" },
  { id: `${prefix}-lens-scratch-c`, metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 1, grade: "C" },
  { id: `${prefix}-lens-scratch-reject`, metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 5, grade: "Reject" },
  { id: `${prefix}-lens-crack`, metric: "count", defect: "crack", view: "lens", comparison: ">", threshold: 0, grade: "Reject" },
  { id: `${prefix}-lens-chip-c`, metric: "share", defect: "chip", zone: "lens-window", comparison: ">", threshold: 0, grade: "C" },
  { id: `${prefix}-dust-b`, metric: "count", defect: "dust", view: "lens", comparison: ">", threshold: 0, grade: "B" },
  { id: `${prefix}-dust-c`, metric: "count", defect: "dust", view: "lens", comparison: ">", threshold: 2, grade: "C" },
  { id: `${prefix}-dust-size-c`, metric: "maxDiameterMm", defect: "dust", view: "lens", comparison: ">", threshold: 0.2, grade: "C" },
  { id: `${prefix}-moisture`, metric: "count", defect: "moisture", comparison: ">", threshold: 0, grade: "Reject" },
  { id: `${prefix}-body-scratch-b`, metric: "maxLengthMm", defect: "scratch", comparison: ">", threshold: 3, grade: "B" },
  { id: `${prefix}-body-scratch-c`, metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 10, grade: "C" },
  { id: `${prefix}-corrosion-c`, metric: "share", defect: "corrosion", zone: "connector", comparison: ">", threshold: 0, grade: "C" },
  { id: `${prefix}-corrosion-reject`, metric: "share", defect: "corrosion", zone: "connector", comparison: ">", threshold: 10, grade: "Reject" },
  { id: `${prefix}-torn-flex`, metric: "count", defect: "torn-flex", comparison: ">", threshold: 0, grade: "Reject" },
  { id: `${prefix}-stain-b`, metric: "share", defect: "stain", zone: "body", comparison: ">", threshold: 5, grade: "B" },
];

/** Flex cables: a tear or water is fatal, contact corrosion degrades the connection (c). */
const flexRules = (prefix: string): Rule[] => [
  { id: `${prefix}-torn`, metric: "count", defect: "torn-flex", comparison: ">", threshold: 0, grade: "Reject" },
  { id: `${prefix}-moisture`, metric: "count", defect: "moisture", comparison: ">", threshold: 0, grade: "Reject" },
  { id: `${prefix}-contact-corrosion-c`, metric: "share", defect: "corrosion", zone: "contacts", comparison: ">", threshold: 0, grade: "C" },
  { id: `${prefix}-contact-corrosion-reject`, metric: "share", defect: "corrosion", zone: "contacts", comparison: ">", threshold: 5, grade: "Reject" },
  { id: `${prefix}-connector-corrosion-c`, metric: "share", defect: "corrosion", zone: "connector", comparison: ">", threshold: 0, grade: "C" },
  { id: `${prefix}-contact-scratch-c`, metric: "share", defect: "scratch", zone: "contacts", comparison: ">", threshold: 1, grade: "C" },
  { id: `${prefix}-scratch-b`, metric: "count", defect: "scratch", comparison: ">", threshold: 3, grade: "B" },
  { id: `${prefix}-dent-b`, metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "B" },
  { id: `${prefix}-stain-b`, metric: "share", defect: "stain", zone: "body", comparison: ">", threshold: 10, grade: "B" },
  ...functionalRules(prefix),
];

export const EXAMPLE_RUBRICS: Record<ExamplePartTypeSlug, Rubric> = {
  "rear-camera": {
    rules: [
      ...cameraRules("rear"),
      { id: "rear-dent-b", metric: "areaMm2", defect: "dent", zone: "body", comparison: ">", threshold: 1, grade: "B" },
      { id: "rear-dent-c", metric: "areaMm2", defect: "dent", zone: "body", comparison: ">", threshold: 4, grade: "C" },
      ...functionalRules("rear"),
    ],
    notes: [EXAMPLE_NOTE, STATIC_NOTE, DEFER_NOTE],
  },
  "front-camera": {
    rules: [...cameraRules("front"), ...functionalRules("front")],
    notes: [EXAMPLE_NOTE, STATIC_NOTE, DEFER_NOTE],
  },
  battery: {
    rules: [
      // Safety first: also rejected by the built-in rule (swelling is critical), kept explicit here
      // so the rubric stays safe even if a part type's severities are misconfigured.
      { id: "battery-swelling", metric: "count", defect: "swelling", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "battery-dent", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "battery-torn-flex", metric: "count", defect: "torn-flex", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "battery-moisture", metric: "count", defect: "moisture", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "battery-contact-corrosion-c", metric: "share", defect: "corrosion", zone: "contacts", comparison: ">", threshold: 0, grade: "C" },
      { id: "battery-contact-corrosion-reject", metric: "share", defect: "corrosion", zone: "contacts", comparison: ">", threshold: 10, grade: "Reject" },
      { id: "battery-label-scratch-b", metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 10, grade: "B" },
      { id: "battery-label-scratch-c", metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 40, grade: "C" },
      { id: "battery-stain-b", metric: "share", defect: "stain", zone: "body", comparison: ">", threshold: 5, grade: "B" },
      ...functionalRules("battery"),
    ],
    notes: [BATTERY_CAUTION, EXAMPLE_NOTE, DEFER_NOTE],
  },
  "back-housing": {
    rules: [
      { id: "housing-crack", metric: "count", defect: "crack", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "housing-scratch-b", metric: "maxLengthMm", defect: "scratch", view: "back", comparison: ">", threshold: 5, grade: "B" },
      { id: "housing-scratch-total-c", metric: "totalLengthMm", defect: "scratch", view: "back", comparison: ">", threshold: 20, grade: "C" },
      { id: "housing-scratch-share-c", metric: "share", defect: "scratch", zone: "body", comparison: ">", threshold: 2, grade: "C" },
      { id: "housing-lens-window-scratch-c", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "C" },
      { id: "housing-dent-b", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "B" },
      { id: "housing-dent-c", metric: "areaMm2", defect: "dent", comparison: ">", threshold: 4, grade: "C" },
      { id: "housing-chip-b", metric: "count", defect: "chip", comparison: ">", threshold: 0, grade: "B" },
      { id: "housing-chip-c", metric: "maxDiameterMm", defect: "chip", comparison: ">", threshold: 2, grade: "C" },
      { id: "housing-screw-boss", metric: "count", defect: "screw-boss", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "housing-stain-b", metric: "share", defect: "stain", zone: "body", comparison: ">", threshold: 3, grade: "B" },
      { id: "housing-corrosion-b", metric: "count", defect: "corrosion", comparison: ">", threshold: 0, grade: "B" },
      ...functionalRules("housing", 1),
    ],
    notes: [EXAMPLE_NOTE, DEFER_NOTE],
  },
  display: {
    rules: [
      // ISO 13406-2 classes (a: docs/references.md table); which class a grade allows is (c) invented.
      { id: "display-pixels-b", metric: "pixelFaultClass", comparison: "worse-than", threshold: "I", grade: "B" },
      { id: "display-pixels-c", metric: "pixelFaultClass", comparison: "worse-than", threshold: "II", grade: "C" },
      { id: "display-pixels-reject", metric: "pixelFaultClass", comparison: "worse-than", threshold: "III", grade: "Reject" },
      { id: "display-lit-pixel-black-c", metric: "count", defect: "pixel-lit", view: "screen-black", comparison: ">", threshold: 1, grade: "C" },
      { id: "display-crack", metric: "count", defect: "crack", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "display-scratch-b", metric: "share", defect: "scratch", zone: "screen-active", comparison: ">", threshold: 0.1, grade: "B" },
      { id: "display-scratch-c", metric: "share", defect: "scratch", zone: "screen-active", comparison: ">", threshold: 1, grade: "C" },
      { id: "display-scratch-length-c", metric: "maxLengthMm", defect: "scratch", view: "front", comparison: ">", threshold: 10, grade: "C" },
      { id: "display-chip-b", metric: "count", defect: "chip", view: "front", comparison: ">", threshold: 0, grade: "B" },
      { id: "display-chip-c", metric: "maxDiameterMm", defect: "chip", comparison: ">", threshold: 1, grade: "C" },
      { id: "display-dust-b", metric: "count", defect: "dust", view: "screen-white", comparison: ">", threshold: 0, grade: "B" },
      { id: "display-dust-c", metric: "count", defect: "dust", view: "screen-white", comparison: ">", threshold: 3, grade: "C" },
      { id: "display-stain-c", metric: "share", defect: "stain", zone: "screen-active", comparison: ">", threshold: 0.5, grade: "C" },
      { id: "display-dent-b", metric: "count", defect: "dent", view: "back", comparison: ">", threshold: 0, grade: "B" },
      { id: "display-moisture", metric: "count", defect: "moisture", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "display-torn-flex", metric: "count", defect: "torn-flex", comparison: ">", threshold: 0, grade: "Reject" },
      ...functionalRules("display"),
    ],
    notes: [EXAMPLE_NOTE, STATIC_NOTE, DEFER_NOTE],
  },
  "charging-flex": { rules: flexRules("charging"), notes: [EXAMPLE_NOTE, STATIC_NOTE, DEFER_NOTE] },
  "button-flex": { rules: flexRules("button"), notes: [EXAMPLE_NOTE, STATIC_NOTE, DEFER_NOTE] },
  loudspeaker: {
    rules: [
      { id: "speaker-moisture", metric: "count", defect: "moisture", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "speaker-torn-flex", metric: "count", defect: "torn-flex", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "speaker-dent-c", metric: "count", defect: "dent", view: "front", comparison: ">", threshold: 0, grade: "C" },
      { id: "speaker-dent-b", metric: "count", defect: "dent", view: "back", comparison: ">", threshold: 0, grade: "B" },
      { id: "speaker-dust-b", metric: "share", defect: "dust", view: "front", comparison: ">", threshold: 5, grade: "B" },
      { id: "speaker-dust-c", metric: "share", defect: "dust", view: "front", comparison: ">", threshold: 20, grade: "C" },
      { id: "speaker-contact-corrosion-c", metric: "share", defect: "corrosion", zone: "contacts", comparison: ">", threshold: 0, grade: "C" },
      { id: "speaker-contact-corrosion-reject", metric: "share", defect: "corrosion", zone: "contacts", comparison: ">", threshold: 10, grade: "Reject" },
      { id: "speaker-scratch-b", metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 10, grade: "B" },
      { id: "speaker-stain-b", metric: "share", defect: "stain", zone: "body", comparison: ">", threshold: 10, grade: "B" },
      ...functionalRules("speaker"),
    ],
    notes: [EXAMPLE_NOTE, DEFER_NOTE],
  },
};
