import { revokeEvidenceLink } from "@/lib/evidence/evidence-link";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";
import { z } from "zod";

/** Withdraws the pack's evidence link: its public page then says so and serves no file. */
export const POST = handler({ permission: "evidence.send" }, async (req, ctx: RouteContext<"/api/evidence-packs/[id]/revoke">, user) => {
  const packId = parseId((await ctx.params).id, "That evidence pack");
  await parseJson(req, z.object({}).strict(), { allowEmpty: true, maxBytes: 1024 });
  const pack = await revokeEvidenceLink(user, packId);
  return Response.json({ evidencePack: { id: pack.id, revokedAt: pack.revokedAt } });
});
