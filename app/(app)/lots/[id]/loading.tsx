import { DetailSkeleton } from "@/components/ui/segment-states";

export default function LotLoading() {
  return <DetailSkeleton label="Loading the lot…" cards={[10, 40, 24, 32]} maxWidth="max-w-6xl" />;
}
