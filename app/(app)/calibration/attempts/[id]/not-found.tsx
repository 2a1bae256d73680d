import { DetailNotFound } from "@/components/ui/segment-states";

export default function CalibrationAttemptNotFound() {
  return <DetailNotFound what="calibration attempt" backHref="/calibration" backLabel="Back to Calibration" />;
}
