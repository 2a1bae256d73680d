import { DetailSkeleton } from "@/components/ui/segment-states";

export default function Loading() {
  return <DetailSkeleton label="Loading the calibration attempt…" cards={[60]} maxWidth="max-w-7xl" />;
}
