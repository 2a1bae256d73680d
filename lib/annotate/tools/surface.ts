/**
 * Surface: the part's own visible outline, drawn like Outline but with no defect class. Coverage
 * shares are taken against the union of a photo's surfaces; several are allowed for photos that
 * show more than one face or piece of a part.
 */
import type { PolygonShape } from "@/lib/geometry/shape";
import { addSurface } from "../model";
import { createVertexTool, type VertexToolSpec } from "./vertex-draft";

export const surfaceSpec: VertexToolSpec = {
  id: "surface",
  label: "Surface",
  key: "f",
  description: "Trace the part's visible face; coverage is measured against it.",
  closed: true,
  isEnabled: () => true,
  shapeFrom: (_state, points): PolygonShape => ({ kind: "polygon", points }),
  commit: (state, shape) => (shape.kind === "polygon" ? addSurface(state, shape) : state),
};

export const surfaceTool = createVertexTool(surfaceSpec);
