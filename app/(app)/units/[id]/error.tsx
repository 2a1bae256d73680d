"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function UnitError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="unit" backHref="/queue" backLabel="Back to the Queue" />;
}
