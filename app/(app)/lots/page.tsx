import type { Metadata } from "next";
import { PlannedScreen } from "@/components/shell/planned-screen";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/lots")!;
export const metadata: Metadata = { title: screen.label };

export default async function LotsPage() {
  await requirePageUser({ role: screen.roles, from: screen.href });
  return (
    <PlannedScreen
      screen={screen}
      coming={[
        "Receive a lot: supplier, purchase reference, part type, quantity, inspection level and AQL.",
        "See the ISO 2859-1 sampling plan stored with the lot, progress and the running verdict.",
        "Record the lead's disposition: to stock, downgrade, sort or return to vendor.",
        ]}
    />
  );
}
