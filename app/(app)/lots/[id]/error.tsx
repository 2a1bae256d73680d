"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function LotError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="lot" backHref="/lots" backLabel="Back to Lots" />;
}
