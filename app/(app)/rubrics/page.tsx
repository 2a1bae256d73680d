import type { Metadata } from "next";
import { PlannedScreen } from "@/components/shell/planned-screen";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/rubrics")!;
export const metadata: Metadata = { title: screen.label };

export default async function RubricsPage() {
  await requirePageUser({ role: screen.roles, from: screen.href });
  return (
    <PlannedScreen
      screen={screen}
      coming={[
        "Draft rubric versions per part type with a live preview; leads publish them.",
        "Read the difference between two versions.",
        ]}
    />
  );
}
