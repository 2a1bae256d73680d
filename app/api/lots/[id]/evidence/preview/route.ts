import { PREVIEW_LINK_URL, prepareEvidence } from "@/lib/evidence/evidence-packs";
import { evidenceDraftSchema } from "@/lib/evidence/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The e-mail as the supplier would get it (template filled, files rendered and sized); nothing is stored or sent. */
export const POST = handler({ permission: "evidence.send" }, async (req, ctx: RouteContext<"/api/lots/[id]/evidence/preview">, user) => {
  const lotId = parseId((await ctx.params).id, "That lot");
  const draft = await parseJson(req, evidenceDraftSchema, { maxBytes: 32 * 1024 });
  const p = await prepareEvidence(user, lotId, draft, () => PREVIEW_LINK_URL);
  return Response.json({
    preview: {
      to: p.to,
      subject: p.subject,
      text: p.text,
      claimRef: p.claimRef,
      delivery: p.delivery,
      totalBytes: p.totalBytes,
      attachments: p.files.map(({ filename, contentType, bytes }) => ({ filename, contentType, bytes })),
    },
  });
});
