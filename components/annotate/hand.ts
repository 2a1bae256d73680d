/**
 * The tool and class in hand, as the page sees them. A canvas tells the page about a change in the
 * very event that makes it (a key, a rail or class button, a pick in the region list), not only
 * from an effect after its next render: when that event races a photo switch (a thumbnail click
 * whose save of the previous photo has just finished), React may unmount the old canvas in the
 * same render, its effect never runs and the next photo would open with the old tool. Pure.
 */
import type { AnnotationState } from "@/lib/annotate/types";
import type { ToolInHand } from "./types";

/** The hand after `next` when it differs from the hand before; else null. */
export function handChanged(before: AnnotationState, next: AnnotationState): ToolInHand | null {
  return before.activeTool === next.activeTool && before.activeDefect === next.activeDefect ? null : { tool: next.activeTool, defect: next.activeDefect };
}
