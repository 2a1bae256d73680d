import { DetailSkeleton } from "@/components/ui/segment-states";

export default function LotReportLoading() {
  return <DetailSkeleton label="Loading the lot report…" cards={[16, 24, 20, 40]} maxWidth="max-w-5xl" />;
}
