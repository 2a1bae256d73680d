import { DetailNotFound } from "@/components/ui/segment-states";

export default function SupplierNotFound() {
  return <DetailNotFound what="supplier" backHref="/suppliers" backLabel="Back to Suppliers" />;
}
