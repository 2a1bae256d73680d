"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import type { GalleryItemDto } from "@/lib/gallery/dto";
import { ApiError, apiFetch } from "@/lib/http/client";
import { galleryKeys } from "@/lib/query-keys/gallery";

/**
 * "Add to gallery" for a graded unit's photo (trainers and leads): its regions and the unit's grade
 * become a draft gallery item, which opens from the link that replaces the button. A photo already
 * in the gallery links to that item instead.
 */
export function AddToGallery({ photoId }: { photoId: string }) {
  const queryClient = useQueryClient();
  const promote = useMutation({
    mutationFn: () => apiFetch<{ item: GalleryItemDto }>("/api/gallery", { body: { photoId } }),
    onSuccess: ({ item }) => queryClient.setQueryData(galleryKeys.item(item.id), { item }),
  });
  const existingId = promote.error instanceof ApiError && promote.error.status === 409 ? promote.error.fieldErrors.photoId : undefined;
  if (promote.data) {
    return (
      <Link href={`/gallery/${promote.data.item.id}`} className="text-sm font-medium text-gauge-800 underline" data-testid="gallery-draft-link">
        Added as a draft: open it to caption and publish
      </Link>
    );
  }
  if (existingId) {
    return (
      <Link href={`/gallery/${existingId}`} className="text-sm font-medium text-gauge-800 underline" data-testid="gallery-draft-link">
        Already in the gallery: open it
      </Link>
    );
  }
  return (
    <span className="flex items-center gap-2">
      {promote.error && (
        <span className="text-xs text-fault-700" role="alert">
          {promote.error.message}
        </span>
      )}
      <button
        type="button"
        className="btn-secondary h-8 py-0 text-sm"
        disabled={promote.isPending}
        onClick={() => promote.mutate()}
        title="Copy this photo's regions and the unit's grade into a draft gallery item"
        data-testid="add-to-gallery"
      >
        {promote.isPending ? "Adding…" : "Add to gallery"}
      </button>
    </span>
  );
}
