/** A claim's statuses (plain data: the schema, the API and the screens share them). */
export const CLAIM_STATUSES = ["open", "credited", "replaced", "refused", "closed"] as const;
export type ClaimStatus = (typeof CLAIM_STATUSES)[number];
export const CLAIM_STATUS_LABELS: Record<ClaimStatus, string> = { open: "Open", credited: "Credited", replaced: "Replaced", refused: "Refused", closed: "Closed" };
