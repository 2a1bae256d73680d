/**
 * The invented lots of the Vellmoor demo, oldest first. Orvane's rear camera modules have five
 * decided lots with two rejections (the 2nd and 5th), so their sixth lot is on tightened inspection.
 * `failures` maps a sample position to the checklist items that fail there (with the failing
 * value); every other recorded item passes. `recorded` is how many units (in sample order) have a
 * complete checklist; `expect` is the verdict the seed must reach (it checks itself).
 */
import type { Disposition } from "@/lib/lots/schemas";
import type { ChecklistValue } from "@/lib/units/schemas";

export type LotSpec = {
  supplier: string;
  partType: string;
  serialPrefix: string;
  purchaseRef: string;
  quantity: number;
  receivedDaysAgo: number;
  dueInDays: number;
  units: "serials" | "placeholders" | "none";
  /** Units (in sample order) with a complete checklist; "all" = the whole sample. */
  recorded: number | "all";
  failures?: Record<number, { itemId: string; value: ChecklistValue }[]>;
  decision?: { disposition: Disposition; reason: string; expect: "accept" | "reject" };
};

const ORVANE = "Orvane Mobile Supply";
const LUMABAY = "Lumabay Trading";
const TAMSIN = "Tamsin Ridge Components";
const focusFail = { itemId: "photo-focus", value: { pass: false } };
const nightFail = { itemId: "night-mode", value: { pass: false } };

export const LOT_SCENARIO: LotSpec[] = [
  {
    supplier: ORVANE,
    partType: "rear-camera",
    serialPrefix: "OV-CAM-24",
    purchaseRef: "PO-24-0611",
    quantity: 120,
    receivedDaysAgo: 48,
    dueInDays: 5,
    units: "serials",
    recorded: "all",
    failures: { 9: [nightFail] },
    decision: { disposition: "to_stock", reason: "Within plan; one night-mode fault noted for the supplier.", expect: "accept" },
  },
  {
    supplier: ORVANE,
    partType: "rear-camera",
    serialPrefix: "OV-CAM-24",
    purchaseRef: "PO-24-0640",
    quantity: 120,
    receivedDaysAgo: 40,
    dueInDays: 5,
    units: "serials",
    recorded: "all",
    failures: { 4: [focusFail] },
    decision: { disposition: "return_to_vendor", reason: "Autofocus does not lock on unit 4; major Re reached. RMA requested.", expect: "reject" },
  },
  {
    supplier: ORVANE,
    partType: "rear-camera",
    serialPrefix: "OV-CAM-24",
    purchaseRef: "PO-24-0668",
    quantity: 120,
    receivedDaysAgo: 33,
    dueInDays: 5,
    units: "serials",
    recorded: "all",
    decision: { disposition: "to_stock", reason: "Clean sample.", expect: "accept" },
  },
  {
    supplier: ORVANE,
    partType: "rear-camera",
    serialPrefix: "OV-CAM-24",
    purchaseRef: "PO-24-0701",
    quantity: 120,
    receivedDaysAgo: 25,
    dueInDays: 5,
    units: "serials",
    recorded: "all",
    failures: { 15: [nightFail] },
    decision: { disposition: "to_stock", reason: "Within plan.", expect: "accept" },
  },
  {
    supplier: ORVANE,
    partType: "rear-camera",
    serialPrefix: "OV-CAM-24",
    purchaseRef: "PO-24-0733",
    quantity: 120,
    receivedDaysAgo: 17,
    dueInDays: 5,
    units: "serials",
    recorded: "all",
    failures: { 2: [{ itemId: "grey-card", value: { choice: "visible" } }], 11: [focusFail] },
    decision: { disposition: "sort", reason: "Two major faults; sorting the whole lot before stocking.", expect: "reject" },
  },
  { supplier: ORVANE, partType: "rear-camera", serialPrefix: "OV-CAM-24", purchaseRef: "PO-24-0769", quantity: 120, receivedDaysAgo: 3, dueInDays: 4, units: "serials", recorded: 6 },
  {
    supplier: ORVANE,
    partType: "charging-flex",
    serialPrefix: "OV-CHG-24",
    purchaseRef: "PO-24-0702",
    quantity: 80,
    receivedDaysAgo: 22,
    dueInDays: 6,
    units: "serials",
    recorded: "all",
    failures: { 5: [{ itemId: "charge-current", value: { reading: 0.31 } }] },
    decision: { disposition: "return_to_vendor", reason: "Charge current far below 0.50 A on unit 5.", expect: "reject" },
  },
  { supplier: ORVANE, partType: "button-flex", serialPrefix: "OV-BTN-24", purchaseRef: "PO-24-0774", quantity: 300, receivedDaysAgo: 2, dueInDays: 8, units: "serials", recorded: 0 },
  {
    supplier: TAMSIN,
    partType: "battery",
    serialPrefix: "TR-BAT-24",
    purchaseRef: "TR-5521",
    quantity: 200,
    receivedDaysAgo: 4,
    dueInDays: 2,
    units: "serials",
    recorded: 8,
    failures: { 3: [{ itemId: "cycle-count", value: { reading: 912 } }] },
  },
  {
    supplier: TAMSIN,
    partType: "loudspeaker",
    serialPrefix: "TR-SPK-24",
    purchaseRef: "TR-5480",
    quantity: 60,
    receivedDaysAgo: 12,
    dueInDays: 7,
    units: "serials",
    recorded: "all",
    decision: { disposition: "to_stock", reason: "All test tones clean.", expect: "accept" },
  },
  { supplier: LUMABAY, partType: "display", serialPrefix: "LB-DSP-24", purchaseRef: "LB-7713", quantity: 24, receivedDaysAgo: 5, dueInDays: 3, units: "placeholders", recorded: 0 },
  { supplier: LUMABAY, partType: "back-housing", serialPrefix: "LB-HSG-24", purchaseRef: "LB-7720", quantity: 150, receivedDaysAgo: 1, dueInDays: 9, units: "none", recorded: 0 },
];
