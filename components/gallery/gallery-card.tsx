import Link from "next/link";
import type { GalleryCardDto } from "@/lib/gallery/dto";
import { ItemBadges } from "./item-badges";
import { RegionOverlay } from "./region-overlay";

export type ClassLabels = Readonly<Record<string, string>>;

/**
 * One item in a grid: its thumbnail with the regions drawn over it (the whole photo, letterboxed,
 * never cropped, so every region stays on the part), grade, normal/abnormal, classes and caption.
 */
export function GalleryCard({
  item,
  viewLabel,
  classLabels,
  classKeys,
  showStatus,
  href,
  action,
}: {
  item: GalleryCardDto;
  viewLabel: string;
  classLabels: ClassLabels;
  classKeys: readonly string[];
  showStatus: boolean;
  href: string;
  action?: React.ReactNode;
}) {
  const { photo } = item;
  const classes = item.defectClasses.map((c) => classLabels[c] ?? c).join(", ");
  return (
    <article className="card flex flex-col overflow-hidden" data-testid="gallery-card" data-item-id={item.id} data-kind={item.kind} data-grade={item.grade}>
      <Link
        href={href}
        className="group block focus-visible:outline-offset-[-2px]"
        aria-label={`${item.partType.name}, ${viewLabel}: ${item.kind}, grade ${item.grade}${classes ? `, ${classes}` : ""}`}
      >
        <div className="relative flex aspect-[4/3] items-center justify-center bg-gauge-900">
          {photo.urls && photo.original && photo.thumbnail ? (
            <>
              {/* eslint-disable-next-line @next/next/no-img-element -- served by our own access-checked route */}
              <img src={photo.urls.thumbnail} alt="" width={photo.thumbnail.width} height={photo.thumbnail.height} className="absolute inset-0 h-full w-full object-contain" loading="lazy" />
              <RegionOverlay regions={item.regions} original={photo.original} classKeys={classKeys} />
            </>
          ) : (
            <span className="text-sm text-gauge-100">{photo.ready ? "No image" : "Processing…"}</span>
          )}
        </div>
      </Link>
      <div className="flex flex-1 flex-col gap-1 p-2.5">
        <ItemBadges grade={item.grade} kind={item.kind} status={item.status} showStatus={showStatus} />
        <p className="text-xs text-gauge-700">
          {item.partType.name} · {viewLabel}
          {classes && <> · {classes}</>}
        </p>
        <p className="line-clamp-3 text-sm text-gauge-900">{item.caption || <span className="text-gauge-600 italic">No caption yet</span>}</p>
        {action && <div className="mt-auto pt-1">{action}</div>}
      </div>
    </article>
  );
}
