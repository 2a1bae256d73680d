import type { Metadata } from "next";
import { PlannedScreen } from "@/components/shell/planned-screen";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/calibration")!;
export const metadata: Metadata = { title: screen.label };

export default async function CalibrationPage() {
  await requirePageUser({ permission: screen.permission, from: screen.href });
  return <PlannedScreen screen={screen} coming={["Grade calibration sets and see your score against the key.", "Trainers build sets from gallery items."]} />;
}
