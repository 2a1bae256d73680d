import type { Metadata } from "next";
import { PlannedScreen } from "@/components/shell/planned-screen";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/queue")!;
export const metadata: Metadata = { title: screen.label };

export default async function QueuePage() {
  await requirePageUser({ role: screen.roles, from: screen.href });
  return (
    <PlannedScreen
      screen={screen}
      coming={[
        "Press Take next to get the most urgent waiting unit, leased to you so nobody else takes it.",
        "Filter by part type, supplier or lot; see who has which unit on the bench.",
        "Queue depth, units graded today and minutes per unit by part type.",
        ]}
    />
  );
}
