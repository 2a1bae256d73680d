import type { Metadata } from "next";
import { PlannedScreen } from "@/components/shell/planned-screen";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/reports")!;
export const metadata: Metadata = { title: screen.label };

export default async function ReportsPage() {
  await requirePageUser({ permission: screen.permission, from: screen.href });
  return (
    <PlannedScreen
      screen={screen}
      coming={[
        "Lot inspection reports and supplier scorecards with defect Pareto and trends.",
        "CSV export and a one-page condition certificate per unit.",
        ]}
    />
  );
}
