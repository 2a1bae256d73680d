"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function LotReportError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="lot report" backHref="/reports" backLabel="Back to Reports" />;
}
