import { DetailNotFound } from "@/components/ui/segment-states";

export default function LotNotFound() {
  return <DetailNotFound what="lot" backHref="/lots" backLabel="Back to Lots" />;
}
