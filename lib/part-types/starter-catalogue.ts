/**
 * The starter part types: offered to a new workspace at sign-up (and on an empty Part types
 * screen), and the demo's part types. Keys of views, zones and defect classes (and each class's
 * severity) are those lib/grading/example-part-types.ts assumes, so the example rubrics fit. They
 * are examples to adapt. Checklist limits are marked beside each: (a) read in a public source,
 * (c) common practice. Model families are invented.
 */
import { EXAMPLE_LABELS, EXAMPLE_PART_TYPES, type ExamplePartTypeSlug } from "@/lib/grading/example-part-types";
import type { PartCategory } from "@/lib/part-types/schemas";
import type { ChecklistItem, DefectClassDefinition, ViewDefinition, ZoneDefinition } from "@/lib/part-types/schemas";

type Point = [number, number];
const rect = (x0: number, y0: number, x1: number, y1: number): Point[] => [
  [x0, y0],
  [x1, y0],
  [x1, y1],
  [x0, y1],
];
/** A regular octagon, for round lens windows. */
const octagon = (cx: number, cy: number, r: number): Point[] =>
  Array.from({ length: 8 }, (_, i) => [Number((cx + r * Math.cos((i * Math.PI) / 4)).toFixed(4)), Number((cy + r * Math.sin((i * Math.PI) / 4)).toFixed(4))] as Point);
/** A frame (outer rectangle minus inner) as one "keyhole" polygon: out clockwise, in counter-clockwise. */
const frame = (inset: number): Point[] => [
  [0, 0],
  [1, 0],
  [1, 1],
  [0, 1],
  [0, inset],
  [inset, inset],
  [inset, 1 - inset],
  [1 - inset, 1 - inset],
  [1 - inset, inset],
  [0, inset],
];

const zoneLabel = (id: string) => EXAMPLE_LABELS.zones?.[id] ?? id;
const zone = (id: string, polygon: Point[]): ZoneDefinition => ({ id, label: zoneLabel(id).replace(/^./, (c) => c.toUpperCase()), polygon });
const view = (key: string, instructions: string, zones: ZoneDefinition[], required = true): ViewDefinition => ({
  key,
  label: EXAMPLE_LABELS.views?.[key] ?? key,
  required,
  instructions,
  zones,
});

const DEFECT_LABELS: Record<string, string> = {
  scratch: "Scratch",
  crack: "Crack",
  dent: "Dent",
  chip: "Chip",
  dust: "Dust under glass",
  moisture: "Moisture mark",
  corrosion: "Corrosion",
  "torn-flex": "Torn flex",
  stain: "Stain",
  swelling: "Swelling",
  "screw-boss": "Damaged screw boss",
  "pixel-lit": "Always-lit pixel",
  "pixel-dark": "Always-dark pixel",
  "pixel-subpixel": "Sub-pixel fault",
};
const defectsOf = (slug: ExamplePartTypeSlug): DefectClassDefinition[] =>
  EXAMPLE_PART_TYPES[slug].defects.map((key) => ({ key, label: DEFECT_LABELS[key] ?? key, severity: EXAMPLE_PART_TYPES[slug].defectSeverities[key] }));

const BATTERY_ITEM_CAUTION = "Swollen, punctured or hot cells: fire risk — isolate in a fire-safe container, do not charge or press; follow local rules.";
const passFail = (id: string, label: string, severityOnFail: ChecklistItem["severityOnFail"], caution?: string): ChecklistItem => ({
  id,
  label,
  kind: "pass_fail",
  severityOnFail,
  ...(caution ? { caution } : {}),
});

export type CataloguePartType = {
  slug: ExamplePartTypeSlug;
  name: string;
  category: PartCategory;
  modelFamily: string;
  views: ViewDefinition[];
  defectClasses: DefectClassDefinition[];
  checklist: ChecklistItem[];
  nominalSizeMm: { width: number; height: number } | null;
  panelResolution: { width: number; height: number } | null;
  inspectAll: boolean;
  /** The grade lots are bought at by default (new stock: A). */
  promisedGrade: "A" | "B" | "C";
};

const cameraViews = (lensRadius: number) => [
  view("front", "Module face up on the grey card, whole module in frame.", [zone("body", rect(0, 0, 1, 1)), zone("lens-window", octagon(0.5, 0.45, lensRadius))]),
  view("back", "Flip the module; sensor board and flex in frame.", [zone("body", rect(0, 0, 1, 1))]),
  view("lens", "Close-up of the lens window under the ring light, no reflections on the glass.", [zone("lens-window", octagon(0.5, 0.5, 0.45))]),
  view("connector", "Board-to-board connector, pins in focus.", [zone("connector", rect(0.2, 0.25, 0.8, 0.75))]),
];

const cameraChecklist = (front: boolean): ChecklistItem[] => [
  passFail("detected", "Detected by the test device", "major"),
  passFail("photo-image", "Photo mode: live image, no lines or colour cast", "major"),
  passFail("photo-focus", front ? "Photo mode: sharp at arm's length" : "Photo mode: autofocus locks near (10 cm) and far", "major"),
  passFail("video-mode", "Video mode: image and focus hold while recording", "major"),
  passFail(front ? "portrait-mode" : "night-mode", front ? "Portrait mode: depth effect works" : "Night mode: image without banding", "minor"),
  {
    id: "grey-card",
    label: "Grey card at full zoom: spots or shading",
    kind: "choice",
    options: [
      { value: "none", label: "None", passes: true },
      { value: "faint", label: "Faint, only at full zoom", passes: true },
      { value: "visible", label: "Visible spot or shading", passes: false },
    ],
    severityOnFail: "major",
  },
  ...(front
    ? []
    : [
        {
          id: "stabilisation",
          label: "Optical stabilisation",
          kind: "choice" as const,
          options: [
            { value: "works", label: "Works, silent", passes: true },
            { value: "noisy", label: "Works, audible rattle", passes: false },
            { value: "fails", label: "Image shakes", passes: false },
          ],
          severityOnFail: "major" as const,
        },
      ]),
];

const flexViews = () => [
  view("front", "Flex laid flat on the ESD mat, whole length in frame.", [zone("body", rect(0, 0, 1, 1)), zone("connector", rect(0, 0, 0.22, 1)), zone("contacts", rect(0.82, 0, 1, 1))]),
  view("back", "Flip the flex; stiffeners and adhesive in frame.", [zone("body", rect(0, 0, 1, 1))]),
  view("connector", "Close-up of the connector and contacts.", [zone("connector", rect(0, 0, 0.6, 1)), zone("contacts", rect(0.6, 0, 1, 1))]),
];

export const PART_TYPE_CATALOGUE: CataloguePartType[] = [
  {
    slug: "rear-camera",
    name: "Rear camera module",
    category: "camera",
    modelFamily: "Korvo X2",
    views: cameraViews(0.28),
    defectClasses: defectsOf("rear-camera"),
    checklist: cameraChecklist(false),
    nominalSizeMm: { width: 24, height: 20 },
    panelResolution: null,
    inspectAll: false,
    promisedGrade: "A",
  },
  {
    slug: "front-camera",
    name: "Front camera",
    category: "camera",
    modelFamily: "Korvo X2",
    views: cameraViews(0.32),
    defectClasses: defectsOf("front-camera"),
    checklist: cameraChecklist(true),
    nominalSizeMm: { width: 12, height: 8 },
    panelResolution: null,
    inspectAll: false,
    promisedGrade: "A",
  },
  {
    slug: "battery",
    name: "Battery",
    category: "battery",
    modelFamily: "Korvo X2",
    views: [
      view("front", "Cell label up on the fire-safe tray; do not press the cell.", [zone("body", rect(0, 0, 1, 0.86)), zone("contacts", rect(0.35, 0.86, 0.65, 1))]),
      view("back", "Flip gently; look for bulges along the edges.", [zone("body", rect(0, 0, 1, 1))]),
      view("connector", "Close-up of the protection board and connector.", [zone("connector", rect(0.25, 0.2, 0.75, 0.8)), zone("contacts", rect(0, 0, 1, 0.2))]),
    ],
    defectClasses: defectsOf("battery"),
    checklist: [
      // Swollen or hot cells are a fire hazard (c): any such finding is critical.
      passFail("swelling", "No swelling: the cell lies flat, no bulge at the edges", "critical", BATTERY_ITEM_CAUTION),
      passFail("not-hot", "Not warm to the touch at rest", "critical", BATTERY_ITEM_CAUTION),
      passFail("gauge-detected", "Battery reader detects the fuel gauge", "major"),
      // Full charge 4.20–4.40 V for phone cells, device cut-off about 3.0 V (a, docs/references.md);
      // below 3.00 V flags a deeply discharged cell (c); protection circuits open at about 2.5 V
      // and such packs may not charge normally (a, BU-802c): below 2.50 V, set aside as suspect (c).
      {
        id: "ocv",
        label: "Open-circuit voltage",
        kind: "numeric",
        unit: "V",
        min: 3.0,
        max: 4.4,
        decimals: 2,
        severityOnFail: "major",
        suspectBelow: 2.5,
        caution: "Below 2.50 V the cell is over-discharged: do not charge it normally; set it aside as suspect.",
      },
      // Replace below 80 % of design capacity: common practice (c).
      { id: "health", label: "Health (capacity of design)", kind: "numeric", unit: "%", min: 80, max: 100, decimals: 0, severityOnFail: "major" },
      // Invented example limit (c), in the spirit of the EU's 800-cycle durability figure (a).
      { id: "cycle-count", label: "Cycle count", kind: "numeric", unit: "cycles", min: 0, max: 800, decimals: 0, severityOnFail: "minor" },
    ],
    nominalSizeMm: { width: 44, height: 70 },
    panelResolution: null,
    inspectAll: false,
    promisedGrade: "A",
  },
  {
    slug: "back-housing",
    name: "Back housing",
    category: "housing",
    modelFamily: "Korvo X2",
    views: [
      view("front", "Outside face up, whole housing in frame, diffuse light.", [zone("body", rect(0, 0, 1, 1)), zone("lens-window", rect(0.06, 0.03, 0.34, 0.18)), zone("bezel", frame(0.04))]),
      view("back", "Inside face up: clips, screw bosses, adhesive.", [zone("body", rect(0, 0, 1, 1))]),
    ],
    defectClasses: defectsOf("back-housing"),
    checklist: [
      passFail("fit", "Clips and screw bosses hold on the test frame", "major"),
      passFail("lens-cover", "Camera lens cover glass intact and seated", "major"),
      passFail("side-keys", "Side keys in the frame click", "minor"),
      {
        id: "colour",
        label: "Colour against the reference swatch",
        kind: "choice",
        severityOnFail: "minor",
        options: [
          { value: "match", label: "Matches", passes: true },
          { value: "slight", label: "Slight deviation", passes: true },
          { value: "clear", label: "Clear deviation", passes: false },
        ],
      },
    ],
    nominalSizeMm: { width: 72, height: 150 },
    panelResolution: null,
    inspectAll: false,
    promisedGrade: "A",
  },
  {
    slug: "display",
    name: "Display assembly",
    category: "display",
    modelFamily: "Korvo X2",
    views: [
      view("front", "Panel off, cover glass up, diffuse light at a low angle.", [zone("screen-active", rect(0.04, 0.03, 0.96, 0.97)), zone("bezel", frame(0.03))]),
      view("back", "Back plate and flex.", [zone("connector", rect(0.3, 0.8, 0.7, 1))]),
      view("screen-white", "Full-white test pattern at maximum brightness.", [zone("screen-active", rect(0.04, 0.03, 0.96, 0.97))]),
      view("screen-black", "Full-black test pattern, room lights dimmed.", [zone("screen-active", rect(0.04, 0.03, 0.96, 0.97))]),
      view("connector", "Close-up of the display connector.", [zone("connector", rect(0.1, 0.2, 0.9, 0.8))]),
    ],
    defectClasses: defectsOf("display"),
    checklist: [
      passFail("image", "Image shown on the test device", "major"),
      passFail("touch-grid", "Touch: every cell of the grid test registers", "major"),
      passFail("multi-touch", "Multi-touch: five fingers tracked", "minor"),
      {
        id: "backlight",
        label: "Backlight on the white pattern",
        kind: "choice",
        severityOnFail: "major",
        options: [
          { value: "even", label: "Even", passes: true },
          { value: "slight-clouding", label: "Slight clouding at the edges", passes: true },
          { value: "bleed", label: "Bleeding or dark areas", passes: false },
        ],
      },
      {
        id: "pixels",
        label: "Pixels on the red, green, blue, white and black patterns",
        kind: "choice",
        severityOnFail: "major",
        options: [
          { value: "none", label: "No faulty pixels", passes: true },
          { value: "some", label: "Faulty pixels (mark each as a Spot)", passes: false },
        ],
      },
      // Invented example limit (c).
      { id: "brightness", label: "Peak brightness on white", kind: "numeric", unit: "cd/m²", min: 350, max: null, decimals: 0, severityOnFail: "minor" },
    ],
    nominalSizeMm: { width: 70, height: 152 },
    panelResolution: { width: 1080, height: 2400 },
    inspectAll: true,
    promisedGrade: "A",
  },
  {
    slug: "charging-flex",
    name: "Charging-port flex",
    category: "flex",
    modelFamily: "Korvo X2",
    views: flexViews(),
    defectClasses: defectsOf("charging-flex"),
    checklist: [
      passFail("charge-detected", "Charging detected on the test device", "major"),
      // USB 2.0 default port power is 500 mA at 5 V (b, from memory); a working port should draw that (c).
      { id: "charge-current", label: "Charge current at 5 V", kind: "numeric", unit: "A", min: 0.5, max: 3, decimals: 2, severityOnFail: "major" },
      passFail("data-path", "Data connection to the bench computer", "major"),
      passFail("audio-path", "Microphone / audio path: test recording plays back clearly", "major"),
      passFail("plug-retention", "Port holds a plug firmly", "minor"),
    ],
    nominalSizeMm: { width: 62, height: 14 },
    panelResolution: null,
    inspectAll: false,
    promisedGrade: "A",
  },
  {
    slug: "button-flex",
    name: "Button flex",
    category: "flex",
    modelFamily: "Korvo X2",
    views: flexViews(),
    defectClasses: defectsOf("button-flex"),
    checklist: [
      passFail("power", "Power button responds", "major"),
      passFail("volume-up", "Volume up responds", "major"),
      passFail("volume-down", "Volume down responds", "major"),
      passFail("side-switch", "Side switch changes the sound profile", "minor"),
    ],
    nominalSizeMm: { width: 45, height: 8 },
    panelResolution: null,
    inspectAll: false,
    promisedGrade: "A",
  },
  {
    slug: "loudspeaker",
    name: "Loudspeaker",
    category: "speaker",
    modelFamily: "Korvo X2",
    views: [
      view("front", "Grille side up, whole speaker in frame.", [zone("body", rect(0, 0, 1, 1)), zone("contacts", rect(0.82, 0.3, 1, 0.7))]),
      view("back", "Back side: seal and contacts.", [zone("body", rect(0, 0, 1, 1))]),
      view("connector", "Close-up of the spring contacts.", [zone("contacts", rect(0.1, 0.1, 0.9, 0.9))]),
    ],
    defectClasses: defectsOf("loudspeaker"),
    checklist: [
      passFail("tone-200", "Audible at the 200 Hz test tone", "major"),
      passFail("tone-1k", "Audible at the 1 kHz test tone", "major"),
      passFail("tone-5k", "Audible at the 5 kHz test tone", "major"),
      {
        id: "rattle",
        label: "Rattle or buzz during the sweep",
        kind: "choice",
        severityOnFail: "major",
        options: [
          { value: "none", label: "None", passes: true },
          { value: "faint", label: "Faint, only close to the ear", passes: true },
          { value: "audible", label: "Audible at arm's length", passes: false },
        ],
      },
      // Invented example limit (c).
      { id: "level-1k", label: "Sound level at 1 kHz, 10 cm", kind: "numeric", unit: "dB(A)", min: 75, max: null, decimals: 0, severityOnFail: "minor" },
    ],
    nominalSizeMm: { width: 16, height: 11 },
    panelResolution: null,
    inspectAll: false,
    promisedGrade: "A",
  },
];
