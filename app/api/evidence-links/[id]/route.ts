import { z } from "zod";
import { evidenceLinkFile } from "@/lib/evidence/evidence-link";
import { handler, parseQuery } from "@/lib/http/route";

const fileQuery = z.object({
  file: z.coerce.number({ error: "Name the file by its number." }).int("Name the file by its number.").min(0, "Name the file by its number.").max(999, "Name the file by its number."),
});

/**
 * Public: one file of an evidence pack behind its link (the path segment is the link's signed
 * token). A tampered, unknown, expired or withdrawn link gets the public page's plain sentence (404).
 */
export const GET = handler({ public: true }, async (req, ctx: RouteContext<"/api/evidence-links/[id]">) => {
  const token = (await ctx.params).id;
  const { file: index } = parseQuery(req, fileQuery);
  const { file, body } = await evidenceLinkFile(decodeURIComponent(token), index);
  return new Response(body, {
    headers: {
      "Content-Type": file.contentType,
      "Content-Length": String(file.bytes),
      "Content-Disposition": `attachment; filename="${file.filename}"`,
      "Cache-Control": "private, no-store",
      "Referrer-Policy": "no-referrer",
    },
  });
});
