/**
 * Line: a polyline with a stroke width, for scratches and cracks. `[` and `]` step the width of
 * the line being drawn (and of lines drawn after it) along LINE_WIDTH_STEPS.
 */
import { maxLineWidthFor } from "@/lib/geometry/clamp";
import type { LineShape } from "@/lib/geometry/shape";
import { stepAlongLadder } from "../constants";
import { addDefectShape, setDefaultLineWidth } from "../model";
import { hasDefectClass } from "./common";
import { createVertexTool, type VertexToolSpec } from "./vertex-draft";

export const lineSpec: VertexToolSpec = {
  id: "line",
  label: "Line",
  key: "l",
  description: "Click along a scratch or crack; double-click or Enter finishes. [ and ] set the width.",
  closed: false,
  isEnabled: hasDefectClass,
  shapeFrom: (state, points): LineShape => ({ kind: "line", points, width: Math.min(state.lineWidth, maxLineWidthFor(state.image)) }),
  commit: addDefectShape,
  extraKey(state, key) {
    if (key !== "[" && key !== "]") return state;
    return setDefaultLineWidth(state, stepAlongLadder(state.lineWidth, key === "]" ? 1 : -1));
  },
  extraShortcuts: [
    { keys: "[", action: "Thinner line" },
    { keys: "]", action: "Wider line" },
  ],
};

export const lineTool = createVertexTool(lineSpec);
