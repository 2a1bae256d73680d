/** Outline: a polygon around a defect (click vertices, or drag a freehand lasso). */
import type { PolygonShape } from "@/lib/geometry/shape";
import { addDefectShape } from "../model";
import { hasDefectClass } from "./common";
import { createVertexTool, type VertexToolSpec } from "./vertex-draft";

export const outlineSpec: VertexToolSpec = {
  id: "outline",
  label: "Outline",
  key: "o",
  description: "Click around a defect; close on the first point, double-click or Enter.",
  closed: true,
  isEnabled: hasDefectClass,
  shapeFrom: (_state, points): PolygonShape => ({ kind: "polygon", points }),
  commit: addDefectShape,
};

export const outlineTool = createVertexTool(outlineSpec);
