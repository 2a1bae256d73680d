/**
 * What the example rubrics assume about each seeded part type: allowed defect classes, zones,
 * views, and which defect classes are critical (any occurrence → Reject). These are invented
 * examples to adapt ((c) common practice), kept here so the example rubrics can be validated;
 * the part-type seed should use the same keys.
 */
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { PartTypeLists } from "./rubric-schema";
import type { GradingLabels } from "./rule-text";

export const EXAMPLE_PART_TYPE_SLUGS = ["rear-camera", "front-camera", "battery", "back-housing", "display", "charging-flex", "button-flex", "loudspeaker"] as const;
export type ExamplePartTypeSlug = (typeof EXAMPLE_PART_TYPE_SLUGS)[number];

export type ExamplePartType = PartTypeLists & { defectSeverities: Record<string, DefectSeverity> };

const flexDefects = ["torn-flex", "corrosion", "moisture", "scratch", "stain", "dent"];

export const EXAMPLE_PART_TYPES: Record<ExamplePartTypeSlug, ExamplePartType> = {
  "rear-camera": {
    defects: ["scratch", "crack", "dent", "chip", "dust", "moisture", "corrosion", "torn-flex", "stain"],
    zones: ["lens-window", "body", "connector"],
    views: ["front", "back", "lens", "connector"],
    defectSeverities: { crack: "critical", moisture: "critical", "torn-flex": "critical", scratch: "major", dust: "major", chip: "major", dent: "minor", corrosion: "major", stain: "minor" },
  },
  "front-camera": {
    defects: ["scratch", "crack", "chip", "dust", "moisture", "corrosion", "torn-flex", "stain"],
    zones: ["lens-window", "body", "connector"],
    views: ["front", "back", "lens", "connector"],
    defectSeverities: { crack: "critical", moisture: "critical", "torn-flex": "critical", scratch: "major", dust: "major", chip: "major", corrosion: "major", stain: "minor" },
  },
  battery: {
    defects: ["swelling", "dent", "scratch", "torn-flex", "corrosion", "moisture", "stain"],
    zones: ["body", "contacts", "connector"],
    views: ["front", "back", "connector"],
    // Swelling is a fire risk: critical, so any swelling region rejects the unit.
    defectSeverities: { swelling: "critical", dent: "major", "torn-flex": "major", moisture: "major", corrosion: "major", scratch: "minor", stain: "minor" },
  },
  "back-housing": {
    defects: ["scratch", "crack", "dent", "chip", "stain", "screw-boss", "corrosion"],
    zones: ["body", "lens-window", "bezel"],
    views: ["front", "back"],
    defectSeverities: { crack: "critical", "screw-boss": "major", dent: "major", chip: "major", scratch: "minor", stain: "minor", corrosion: "minor" },
  },
  display: {
    defects: ["scratch", "crack", "chip", "dent", "pixel-lit", "pixel-dark", "pixel-subpixel", "dust", "stain", "moisture", "torn-flex"],
    zones: ["screen-active", "bezel", "connector"],
    views: ["front", "back", "screen-white", "screen-black", "connector"],
    defectSeverities: {
      crack: "critical",
      moisture: "critical",
      "torn-flex": "critical",
      chip: "major",
      scratch: "major",
      "pixel-lit": "major",
      "pixel-dark": "major",
      "pixel-subpixel": "minor",
      dust: "minor",
      stain: "minor",
      dent: "minor",
    },
  },
  "charging-flex": {
    defects: flexDefects,
    zones: ["connector", "contacts", "body"],
    views: ["front", "back", "connector"],
    defectSeverities: { "torn-flex": "critical", moisture: "major", corrosion: "major", scratch: "minor", stain: "minor", dent: "minor" },
  },
  "button-flex": {
    defects: flexDefects,
    zones: ["connector", "contacts", "body"],
    views: ["front", "back", "connector"],
    defectSeverities: { "torn-flex": "critical", moisture: "major", corrosion: "major", scratch: "minor", stain: "minor", dent: "minor" },
  },
  loudspeaker: {
    defects: ["dent", "scratch", "corrosion", "dust", "moisture", "stain", "torn-flex"],
    zones: ["body", "contacts"],
    views: ["front", "back", "connector"],
    defectSeverities: { moisture: "major", "torn-flex": "major", dent: "major", corrosion: "major", dust: "minor", scratch: "minor", stain: "minor" },
  },
};

/** Human names for the example keys (explanation lines fall back to keys without them). */
export const EXAMPLE_LABELS: GradingLabels = {
  defects: {
    "pixel-lit": "always-lit pixel",
    "pixel-dark": "always-dark pixel",
    "pixel-subpixel": "sub-pixel fault",
    "screw-boss": "damaged screw boss",
    "torn-flex": "torn flex",
    dust: "dust under glass",
    moisture: "moisture mark",
  },
  zones: {
    "lens-window": "lens window",
    body: "body",
    "screen-active": "active screen area",
    bezel: "bezel",
    contacts: "contacts",
    connector: "connector",
  },
  views: {
    front: "Front",
    back: "Back",
    lens: "Lens",
    "screen-white": "Screen white",
    "screen-black": "Screen black",
    connector: "Connector",
  },
};
