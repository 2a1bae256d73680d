/**
 * Upload tickets: what the server promised when it handed out a presigned PUT URL (which unit,
 * which view, which photo id), signed (lib/signing/signed-token.ts) so finalise can trust it
 * without a database row for uploads that may never happen. Pure: the secret and the clock are
 * arguments.
 */
import { z } from "zod";
import { signToken, verifyToken, type TokenRefusal } from "@/lib/signing/signed-token";

const PURPOSE = "photo upload ticket";

const ticketSchema = z
  .object({
    workspaceId: z.uuid(),
    unitId: z.uuid(),
    photoId: z.uuid(),
    viewKey: z.string().min(1).max(64),
    fileName: z.string().max(200),
    uploaderId: z.uuid(),
    /** The length the presigned PUT was signed for; finalise refuses anything else. */
    bytes: z.number().int().positive().optional(),
  })
  .strict();

export type UploadTicket = z.infer<typeof ticketSchema>;

export function signUploadTicket(ticket: UploadTicket, { secret, expiresAt }: { secret: string; expiresAt: Date }): string {
  return signToken(PURPOSE, ticket, { secret, expiresAt });
}

export type TicketCheck = { ok: true; ticket: UploadTicket } | { ok: false; reason: TokenRefusal };

export function verifyUploadTicket(token: string, { secret, now }: { secret: string; now: Date }): TicketCheck {
  const check = verifyToken(PURPOSE, token, ticketSchema, { secret, now });
  return check.ok ? { ok: true, ticket: check.claims } : check;
}
