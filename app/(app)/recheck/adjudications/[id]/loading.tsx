import { DetailSkeleton } from "@/components/ui/segment-states";

export default function Loading() {
  return <DetailSkeleton label="Loading the disagreement…" cards={[10, 40, 24]} maxWidth="max-w-6xl" />;
}
