"use client";

import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/http/client";
import type { PhotoDto } from "@/lib/photos/dto";
import { unitKeys } from "@/lib/query-keys/units";

const POLL_MS = 1500;

/** The unit's photos (every status), polled while any is queued or processing so each turns ready or failed without a reload. */
export function usePhotos(unitId: string) {
  return useQuery({
    queryKey: unitKeys.photos(unitId),
    queryFn: () => apiFetch<{ photos: PhotoDto[]; removed?: PhotoDto[] }>(`/api/units/${unitId}/photos`),
    refetchInterval: (query) => (query.state.data?.photos.some((p) => p.status === "queued" || p.status === "processing") ? POLL_MS : false),
  });
}
