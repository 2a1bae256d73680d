"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function CalibrationAttemptError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="calibration attempt" backHref="/calibration" backLabel="Back to Calibration" />;
}
