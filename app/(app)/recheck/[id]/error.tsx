"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function RecheckSegmentError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="recheck" backHref="/recheck" backLabel="Back to Recheck" />;
}
