import type { Metadata } from "next";
import { RecheckBench } from "@/components/recheck/recheck-bench";
import { requirePageUser } from "@/lib/auth/require-user";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { blindRecheckView } from "@/lib/recheck/blind-view";

export const metadata: Metadata = { title: "Blind recheck" };

/** One recheck on the Bench in recheck mode (only its holder; the blind read path, nothing of the first grade). */
export default async function RecheckBenchPage(props: PageProps<"/recheck/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "recheck.perform", from: `/recheck/${rawId}` });
  const view = await blindRecheckView(user, pageIdOrNotFound(rawId));
  return <RecheckBench view={view} />;
}
