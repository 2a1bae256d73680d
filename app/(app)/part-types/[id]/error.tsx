"use client";

import { SegmentError } from "@/components/ui/segment-error";

export default function PartTypeError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError {...props} what="part type" backHref="/part-types" backLabel="Back to Part types" />;
}
