import type { Metadata } from "next";
import { PlannedScreen } from "@/components/shell/planned-screen";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/recheck")!;
export const metadata: Metadata = { title: screen.label };

export default async function RecheckPage() {
  await requirePageUser({ permission: screen.permission, from: screen.href });
  return (
    <PlannedScreen
      screen={screen}
      coming={[
        "Re-grade a random sample of graded units blind.",
        "Compare regions and grades (IoU, Dice, Cohen's kappa) and adjudicate disagreements.",
        ]}
    />
  );
}
