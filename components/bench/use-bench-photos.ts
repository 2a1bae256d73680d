"use client";
/**
 * The Bench's photos and which one is on the canvas: one autosaver per photo (a switch never drops
 * an edit; leaving the page with unsaved edits asks first), the photo in the URL (?photo=…), the
 * keyboard's PageUp/PageDown, and whether the next canvas should take the keyboard.
 */
import { useQueryClient } from "@tanstack/react-query";
import { useEffect, useMemo, useState, useSyncExternalStore } from "react";
import { usePhotos } from "@/components/photos/use-photos";
import type { PhotoDto } from "@/lib/photos/dto";
import { usePhotoKeys } from "./photo-keys";
import { putRegionSet } from "./regions-api";
import { SaverRegistry } from "./saver-registry";
import { unitKeys } from "@/lib/query-keys/units";

/** A switch waits this long for the previous photo's save; past it the save goes on in the background. */
const SWITCH_FLUSH_MS = 4000;

function useUnsavedPhotos(registry: SaverRegistry): ReadonlySet<string> {
  const key = useSyncExternalStore(registry.subscribe, registry.unsavedPhotoIds, () => "");
  return useMemo(() => new Set(key ? key.split(" ") : []), [key]);
}

export function useBenchPhotos({ unitId, initialPhotoId, keyArea }: { unitId: string; initialPhotoId: string | null; keyArea: HTMLElement | null }) {
  const queryClient = useQueryClient();
  const [registry] = useState(() => new SaverRegistry(putRegionSet, () => void queryClient.invalidateQueries({ queryKey: unitKeys.measurement(unitId) })));
  const unsaved = useUnsavedPhotos(registry);
  const photos = usePhotos(unitId);
  const [selectedId, setSelectedId] = useState<string | null>(initialPhotoId);
  const [switched, setSwitched] = useState(false);
  const ready = useMemo(() => (photos.data?.photos ?? []).filter((p) => p.status === "ready"), [photos.data]);
  const selected = ready.find((p) => p.id === selectedId) ?? ready[0] ?? null;

  // Leaving the page (closing the tab, reloading) while edits are unsaved asks first.
  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (!registry.anyUnsaved()) return;
      e.preventDefault();
      e.returnValue = "";
    };
    const online = () => registry.retryAll();
    window.addEventListener("beforeunload", warn);
    window.addEventListener("online", online);
    return () => {
      window.removeEventListener("beforeunload", warn);
      window.removeEventListener("online", online);
      // Navigating elsewhere in the app: whatever is owed is still sent.
      void registry.flushAll();
    };
  }, [registry]);

  const select = async (photo: PhotoDto) => {
    if (selected && photo.id !== selected.id) {
      await Promise.race([registry.get(selected.id)?.flush(), new Promise((r) => setTimeout(r, SWITCH_FLUSH_MS))]);
    }
    setSelectedId(photo.id);
    setSwitched(true);
    const url = new URL(window.location.href);
    url.searchParams.set("photo", photo.id);
    window.history.replaceState(window.history.state, "", url);
  };

  usePhotoKeys({ area: keyArea, ids: ready.map((p) => p.id), currentId: selected?.id ?? null, onOpen: (id) => void select(ready.find((p) => p.id === id)!) });

  return { photos, ready, selected, select, registry, unsaved, switched };
}
