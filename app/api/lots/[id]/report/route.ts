import { handler } from "@/lib/http/route";
import { loadLotReport } from "@/lib/reports/lot-report-load";
import { renderLotReportPdf } from "@/lib/reports/lot-report-pdf";
import { parseId } from "@/lib/validation";

/** The lot inspection report as a PDF (annotated photos of the defective units included). */
export const GET = handler({ permission: "reports.read" }, async (_req, ctx: RouteContext<"/api/lots/[id]/report">, user) => {
  const id = parseId((await ctx.params).id, "That lot");
  const data = await loadLotReport({ workspaceId: user.workspaceId, name: user.name, roles: user.roles }, id);
  const pdf = await renderLotReportPdf(data, { timeZone: user.timeZone });
  const fileName = `lot-report-${data.lot.purchaseRef.replace(/[^A-Za-z0-9._-]+/g, "_")}.pdf`;
  return new Response(new Uint8Array(pdf), {
    headers: { "Content-Type": "application/pdf", "Content-Disposition": `attachment; filename="${fileName}"`, "Cache-Control": "no-store" },
  });
});
