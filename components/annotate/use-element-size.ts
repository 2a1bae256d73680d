import { useEffect, useState, type RefObject } from "react";
import type { Size } from "@/lib/annotate/coords";

/** The element's content size in whole CSS pixels, kept current with a ResizeObserver. */
export function useElementSize(ref: RefObject<HTMLElement | null>): Size | null {
  const [size, setSize] = useState<Size | null>(null);
  useEffect(() => {
    const element = ref.current;
    if (!element) return;
    const observer = new ResizeObserver(() => {
      const width = Math.floor(element.clientWidth);
      const height = Math.floor(element.clientHeight);
      setSize((previous) => (previous && previous.width === width && previous.height === height ? previous : { width, height }));
    });
    // The observer also reports the size once right after observe().
    observer.observe(element);
    return () => observer.disconnect();
  }, [ref]);
  return size;
}
