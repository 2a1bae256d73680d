import "server-only";
/**
 * The parts of a supplier's scorecard that are not figures: where the ISO 2859-1 switching rules
 * stand for each part type it delivers (with the switches that led there, lib/lots/scheme.ts), and
 * its claims still open.
 */
import { countOpenClaimsBySupplier, listOpenClaims, listSupplierPartTypes } from "@/db/queries/supplier-scorecard";
import { switchingStateFor } from "@/lib/lots/scheme";

export async function loadSupplierSwitching({ workspaceId, supplierId }: { workspaceId: string; supplierId: string }) {
  const types = await listSupplierPartTypes({ workspaceId, supplierId });
  return Promise.all(
    types.map(async (partType) => {
      const { state, decidedLots } = await switchingStateFor({ workspaceId, supplierId, partTypeId: partType.id });
      return {
        partTypeId: partType.id,
        partType: partType.name,
        decidedLots,
        severity: state.severity,
        discontinued: state.discontinued,
        reason: state.reason,
        progress: state.progress,
        transitions: state.transitions,
      };
    }),
  );
}

export const loadOpenClaims = listOpenClaims;
export const loadOpenClaimCounts = countOpenClaimsBySupplier;
