/** Rigid moves of shapes. Pure: every function returns a new shape. */
import type { Point, Shape } from "./shape";

export function translatePoint([x, y]: Point, dx: number, dy: number): Point {
  return [x + dx, y + dy];
}

export function translateShape(shape: Shape, dx: number, dy: number): Shape {
  switch (shape.kind) {
    case "rect":
      return { ...shape, x: shape.x + dx, y: shape.y + dy };
    case "polygon":
      return { kind: "polygon", points: shape.points.map((p) => translatePoint(p, dx, dy)) };
    case "line":
      return { kind: "line", points: shape.points.map((p) => translatePoint(p, dx, dy)), width: shape.width };
    case "spot":
      return { ...shape, x: shape.x + dx, y: shape.y + dy };
  }
}
