/**
 * Text as SVG paths, shaped by fontkit with the PDFs' font (lib/pdf/fonts.ts). librsvg would
 * otherwise pick whatever fonts the server has (or none); paths look the same everywhere and the
 * photos' legends match the reports.
 */
import { fontkitFont, printable, type PdfFontWeight } from "@/lib/pdf/fonts";

export type SvgText = { svg: string; width: number };

/** Width in px of `text` at `size` px (after `printable`). */
export function measureText(text: string, size: number, weight: PdfFontWeight = "regular"): number {
  const font = fontkitFont(weight);
  return (font.layout(printable(text)).advanceWidth * size) / font.unitsPerEm;
}

/** The text as one <path> with its baseline's left end at (x, y). */
export function svgText(text: string, { x, y, size, fill, weight = "regular" }: { x: number; y: number; size: number; fill: string; weight?: PdfFontWeight }): SvgText {
  const font = fontkitFont(weight);
  const scale = size / font.unitsPerEm;
  const run = font.layout(printable(text));
  let pen = 0;
  const parts: string[] = [];
  run.glyphs.forEach((glyph, i) => {
    const position = run.positions[i];
    const d = glyph.path.toSVG();
    if (d) {
      const gx = x + (pen + position.xOffset) * scale;
      const gy = y - position.yOffset * scale;
      // Font units grow upwards; SVG y grows downwards.
      parts.push(`<path transform="translate(${gx.toFixed(2)} ${gy.toFixed(2)}) scale(${scale.toFixed(5)} ${(-scale).toFixed(5)})" d="${d}"/>`);
    }
    pen += position.xAdvance;
  });
  return { svg: `<g fill="${fill}">${parts.join("")}</g>`, width: pen * scale };
}
