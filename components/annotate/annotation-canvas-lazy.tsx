"use client";

/**
 * The entry point pages import. Konva needs `document`, so the canvas is loaded in the browser
 * only (`ssr: false`, which Next allows only inside a client component like this one); the
 * placeholder keeps the page from jumping while the chunk loads.
 */
import dynamic from "next/dynamic";

export const AnnotationCanvasLazy = dynamic(() => import("./annotation-canvas").then((m) => m.AnnotationCanvas), {
  ssr: false,
  loading: () => (
    <div className="flex min-h-[320px] w-full flex-1 items-center justify-center rounded-lg bg-gauge-900 text-sm text-gauge-100" role="status" data-testid="annotation-loading">
      Loading the annotation canvas…
    </div>
  ),
});

export type { AnnotationCanvasHandle, AnnotationCanvasProps } from "./types";
