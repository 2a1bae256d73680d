import sharp from "sharp";
import { suggestSurface } from "@/lib/imaging/suggest-surface";
function shoelace(p: [number, number][]) { let s = 0; for (let i = 0; i < p.length; i++) { const [ax, ay] = p[i], [bx, by] = p[(i + 1) % p.length]; s += ax * by - bx * ay; } return Math.abs(s) / 2; }
async function make(w: number, h: number, bg: number, fg: number, rect: {x:number,y:number,w:number,h:number,r:number,rot?:number}, sd: number, jpeg: boolean) {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}"><rect width="100%" height="100%" fill="rgb(${bg},${bg},${bg})"/><rect x="${rect.x}" y="${rect.y}" width="${rect.w}" height="${rect.h}" rx="${rect.r}" fill="rgb(${fg},${fg},${fg})" transform="rotate(${rect.rot ?? 0} ${rect.x + rect.w/2} ${rect.y + rect.h/2})"/></svg>`;
  const { data, info } = await sharp(Buffer.from(svg)).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  let s = 1; const rnd = () => { s = (s * 16807) % 2147483647; return s / 2147483647; };
  for (let i = 0; i < data.length; i += 3) { const n = Math.sqrt(-2*Math.log(rnd()))*Math.cos(2*Math.PI*rnd())*sd; for (let c=0;c<3;c++) data[i+c] = Math.max(0, Math.min(255, Math.round(data[i+c] + n))); }
  const img = sharp(data, { raw: info });
  return jpeg ? img.jpeg({ quality: 85 }).toBuffer() : img.png().toBuffer();
}
for (const [bg, fg, rot, jpeg] of [[200, 60, 0, false], [40, 170, 0, true], [210, 90, 23, true]] as const) {
  const rect = { x: 300, y: 200, w: 600, h: 450, r: 60, rot };
  const buf = await make(1200, 900, bg, fg, rect, 10, jpeg);
  const t = performance.now();
  const r = await suggestSurface(buf);
  const truth = rect.w * rect.h - (4 - Math.PI) * rect.r ** 2;
  if (r.shape) console.log(bg, fg, rot, r.threshold, r.part, r.confidence, r.shape.points.length, (shoelace(r.shape.points) / truth - 1) * 100, r.areaPx / truth - 1, (performance.now() - t).toFixed(0), r.note);
}
