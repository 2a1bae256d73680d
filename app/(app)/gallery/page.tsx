import type { Metadata } from "next";
import { PlannedScreen } from "@/components/shell/planned-screen";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/gallery")!;
export const metadata: Metadata = { title: screen.label };

export default async function GalleryPage() {
  await requirePageUser({ permission: screen.permission, from: screen.href });
  return (
    <PlannedScreen
      screen={screen}
      coming={[
        "Browse annotated reference photos of normal and abnormal parts with the grade they deserve.",
        "Trainers curate examples per part type and defect class.",
        ]}
    />
  );
}
