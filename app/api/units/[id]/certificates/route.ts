import { issueCertificate, listCertificatesOfUnit } from "@/lib/certificates/certificates";
import { issueCertificateSchema } from "@/lib/certificates/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The unit's condition certificates, newest first. */
export const GET = handler({ permission: "certificates.manage" }, async (_req, ctx: RouteContext<"/api/units/[id]/certificates">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  return Response.json({ certificates: await listCertificatesOfUnit(user, unitId) });
});

/** Issues a certificate for the unit's current grade (409 when it has no grade or no serial). */
export const POST = handler({ permission: "certificates.manage" }, async (req, ctx: RouteContext<"/api/units/[id]/certificates">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await parseJson(req, issueCertificateSchema, { allowEmpty: true, maxBytes: 1024 });
  const row = await issueCertificate(user, unitId);
  return Response.json({ certificate: { id: row.id, shortCode: row.shortCode, contentHash: row.contentHash, issuedAt: row.issuedAt } }, { status: 201 });
});
