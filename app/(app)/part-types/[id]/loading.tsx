import { DetailSkeleton } from "@/components/ui/segment-states";

export default function PartTypeLoading() {
  return <DetailSkeleton label="Loading the part type…" cards={[40, 56]} maxWidth="max-w-5xl" />;
}
