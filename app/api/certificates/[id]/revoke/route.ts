import { revokeCertificate } from "@/lib/certificates/certificates";
import { revokeCertificateSchema } from "@/lib/certificates/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Revokes a certificate with a reason: its verification page says so from then on. */
export const POST = handler({ permission: "certificates.manage" }, async (req, ctx: RouteContext<"/api/certificates/[id]/revoke">, user) => {
  const id = parseId((await ctx.params).id, "That certificate");
  const { reason } = await parseJson(req, revokeCertificateSchema, { maxBytes: 8 * 1024 });
  const row = await revokeCertificate(user, id, reason);
  return Response.json({ certificate: { id: row.id, revokedAt: row.revokedAt, revokeReason: row.revokeReason } });
});
