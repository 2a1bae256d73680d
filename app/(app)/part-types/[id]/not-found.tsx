import { DetailNotFound } from "@/components/ui/segment-states";

export default function PartTypeNotFound() {
  return <DetailNotFound what="part type" backHref="/part-types" backLabel="Back to Part types" />;
}
