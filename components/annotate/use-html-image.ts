import { useEffect, useState } from "react";

export type ImageStatus = { image: HTMLImageElement | null; status: "loading" | "ready" | "failed" };

/**
 * Loads and decodes a bitmap off the main thread (img.decode), so the first draw of a large
 * preview does not stall. A new URL starts over; a stale load never overwrites a newer one.
 */
export function useHtmlImage(url: string): ImageStatus {
  const [loaded, setLoaded] = useState<{ url: string; image: HTMLImageElement | null } | null>(null);
  useEffect(() => {
    let current = true;
    const image = new window.Image();
    image.decoding = "async";
    image.src = url;
    image
      .decode()
      .then(() => current && setLoaded({ url, image }))
      // decode() may refuse a very large bitmap that did load; only a failed load counts as failure.
      .catch(() => current && setLoaded({ url, image: image.complete && image.naturalWidth > 0 ? image : null }));
    return () => {
      current = false;
    };
  }, [url]);
  if (!loaded || loaded.url !== url) return { image: null, status: "loading" };
  return loaded.image ? { image: loaded.image, status: "ready" } : { image: null, status: "failed" };
}
