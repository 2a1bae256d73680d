import { RegionOverlay } from "@/components/gallery/region-overlay";
import type { RegionSetPayload } from "@/lib/geometry/validate";

/** A set item's photo (thumbnail, letterboxed) with the key's regions over it, in the Bench's class looks. */
export function KeyThumbnail({
  src,
  width,
  height,
  regions,
  classKeys,
  label,
}: {
  src: string;
  width: number | null;
  height: number | null;
  regions: RegionSetPayload;
  classKeys: readonly string[];
  label: string;
}) {
  return (
    <div className="relative flex aspect-[4/3] items-center justify-center overflow-hidden rounded-md bg-gauge-900">
      {/* eslint-disable-next-line @next/next/no-img-element -- served by our own access-checked route */}
      <img src={src} alt={label} className="absolute inset-0 h-full w-full object-contain" loading="lazy" />
      {width && height ? <RegionOverlay regions={regions} original={{ width, height }} classKeys={classKeys} /> : null}
    </div>
  );
}
