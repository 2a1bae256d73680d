/** TanStack Query keys of evidence packs and their claims (the lot's panel and the supplier's list). */
export const evidenceKeys = {
  all: ["evidence"] as const,
  lot: (lotId: string) => [...evidenceKeys.all, "lot", lotId] as const,
  supplier: (supplierId: string) => [...evidenceKeys.all, "supplier", supplierId] as const,
};
