import { DetailNotFound } from "@/components/ui/segment-states";

export default function LotReportNotFound() {
  return <DetailNotFound what="lot" backHref="/reports" backLabel="Back to Reports" />;
}
