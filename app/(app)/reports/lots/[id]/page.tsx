import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { LotReportView } from "@/components/reports/lot-report-view";
import { requirePageUser } from "@/lib/auth/require-user";
import { AppError } from "@/lib/errors";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { loadLotReport } from "@/lib/reports/lot-report-load";

export const metadata: Metadata = { title: "Lot report" };

/** The lot inspection report as a web page: the PDF's content without the photos, and the PDF to download. */
export default async function LotReportPage(props: PageProps<"/reports/lots/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "reports.read", from: `/reports/lots/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const data = await loadLotReport({ workspaceId: user.workspaceId, name: user.name, roles: user.roles }, id, { photos: false }).catch((error: unknown) => {
    if (error instanceof AppError && error.code === "not_found") notFound();
    throw error;
  });
  return (
    <div className="max-w-5xl space-y-6">
      <Link href="/reports#lots" className="text-sm text-gauge-600 underline">
        ← Reports
      </Link>
      <LotReportView data={data} lotId={id} timeZone={user.timeZone} />
    </div>
  );
}
