import { DetailNotFound } from "@/components/ui/segment-states";

export default function RecheckNotFound() {
  return <DetailNotFound what="disagreement" backHref="/recheck" backLabel="Back to Recheck" />;
}
