import type { ClaimStatus } from "@/lib/evidence/claim-status";

/** One evidence pack as GET /api/lots/:id/evidence and /api/suppliers/:id/evidence return it. */
export type EvidencePackView = {
  id: string;
  lotId: string;
  purchaseRef: string;
  toAddress: string;
  subject: string;
  attachments: { filename: string; contentType: string; bytes: number }[];
  delivery: "attached" | "link";
  /** Packs sent by link: the link's address and expiry, and when the lead withdrew it. */
  linkUrl: string | null;
  linkExpiresAt: string | null;
  revokedAt: string | null;
  createdAt: string;
  createdByName: string;
  emailId: string;
  emailStatus: "queued" | "sent" | "failed";
  emailError: string | null;
  emailAttempts: number;
  claimId: string;
  claimReference: string;
  claimStatus: ClaimStatus;
  claimNote: string;
  claimVersion: number;
};

export const formatBytes = (bytes: number) => (bytes < 1024 ? `${bytes} B` : bytes < 1048576 ? `${(bytes / 1024).toFixed(0)} KB` : `${(bytes / 1048576).toFixed(1)} MB`);
