import type { Metadata } from "next";
import { EvidenceLinkView } from "@/components/evidence/evidence-link-view";
import { openEvidenceLink } from "@/lib/evidence/evidence-link";

export const metadata: Metadata = { title: "Evidence pack", robots: { index: false, follow: false }, referrer: "no-referrer" };
export const dynamic = "force-dynamic";

/** An evidence link's page: signed out, one pack by its signed token. */
export default async function EvidenceLinkPage(props: PageProps<"/evidence/[token]">) {
  const { token } = await props.params;
  return <EvidenceLinkView answer={await openEvidenceLink(decodeURIComponent(token))} />;
}
