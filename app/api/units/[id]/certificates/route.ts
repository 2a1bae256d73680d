import { listUnitCertificates } from "@/db/queries/certificates";
import { issueCertificate } from "@/lib/certificates/certificates";
import { notFound } from "@/lib/errors";
import { handler } from "@/lib/http/route";
import { getUnitForCertificate } from "@/db/queries/certificates";
import { parseId } from "@/lib/validation";

/** The unit's condition certificates, newest first. */
export const GET = handler({ permission: "certificates.manage" }, async (_req, ctx: RouteContext<"/api/units/[id]/certificates">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  if (!(await getUnitForCertificate({ workspaceId: user.workspaceId, unitId }))) throw notFound("That unit");
  return Response.json({ certificates: await listUnitCertificates({ workspaceId: user.workspaceId, unitId }) });
});

/** Issues a certificate for the unit's current grade (409 when it has no grade or no serial). */
export const POST = handler({ permission: "certificates.manage" }, async (_req, ctx: RouteContext<"/api/units/[id]/certificates">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  const row = await issueCertificate(user, unitId);
  return Response.json({ certificate: { id: row.id, shortCode: row.shortCode, contentHash: row.contentHash, issuedAt: row.issuedAt } }, { status: 201 });
});
