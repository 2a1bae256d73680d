import { DetailSkeleton } from "@/components/ui/segment-states";

export default function Loading() {
  return <DetailSkeleton label="Loading the calibration set…" cards={[24, 40, 40]} maxWidth="max-w-7xl" />;
}
