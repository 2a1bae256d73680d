import { DetailSkeleton } from "@/components/ui/segment-states";

export default function SupplierLoading() {
  return <DetailSkeleton label="Loading the supplier…" cards={[48]} maxWidth="max-w-4xl" />;
}
