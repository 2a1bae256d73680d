import { DetailNotFound } from "@/components/ui/segment-states";

export default function CalibrationSetNotFound() {
  return <DetailNotFound what="calibration set" backHref="/calibration" backLabel="Back to Calibration" />;
}
