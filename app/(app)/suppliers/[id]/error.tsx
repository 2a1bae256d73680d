"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function SupplierError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="supplier" backHref="/suppliers" backLabel="Back to Suppliers" />;
}
