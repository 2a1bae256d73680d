"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function CalibrationSetError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="calibration set" backHref="/calibration" backLabel="Back to Calibration" />;
}
