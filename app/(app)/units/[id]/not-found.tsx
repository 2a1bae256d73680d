import { DetailNotFound } from "@/components/ui/segment-states";

export default function UnitNotFound() {
  return <DetailNotFound what="unit" backHref="/queue" backLabel="Back to the Queue" />;
}
