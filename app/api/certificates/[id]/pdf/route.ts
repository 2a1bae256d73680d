import { certificatePdf } from "@/lib/certificates/certificates";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The one-page certificate as issued (its facts and hash never change; thumbnails are drawn now). */
export const GET = handler({ permission: "certificates.manage" }, async (_req, ctx: RouteContext<"/api/certificates/[id]/pdf">, user) => {
  const id = parseId((await ctx.params).id, "That certificate");
  const { pdf, row } = await certificatePdf(user, id);
  return new Response(new Uint8Array(pdf), {
    headers: { "Content-Type": "application/pdf", "Content-Disposition": `attachment; filename="certificate-${row.shortCode}.pdf"`, "Cache-Control": "no-store" },
  });
});
