import sharp from "sharp";
import { suggestPixelCandidates } from "@/lib/imaging/pixel-candidates";
let s = 7; const rnd = () => { s = (s * 16807) % 2147483647; return s / 2147483647; };
const W = 400, H = 300;
function base(rgb: [number, number, number], sd: number, grad: number) {
  const d = Buffer.alloc(W * H * 3);
  for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) { const n = sd ? Math.sqrt(-2*Math.log(rnd()))*Math.cos(2*Math.PI*rnd())*sd : 0; const g = grad * (x / W - 0.5);
    for (let c = 0; c < 3; c++) d[(y*W+x)*3+c] = Math.max(0, Math.min(255, Math.round(rgb[c] + g + n))); }
  return d;
}
function plant(d: Buffer, x: number, y: number, size: number, rgb: (number|null)[]) {
  for (let yy = y; yy < y + size; yy++) for (let xx = x; xx < x + size; xx++) for (let c = 0; c < 3; c++) if (rgb[c] !== null) d[(yy*W+xx)*3+c] = rgb[c]!;
}
const bgs: [string, [number,number,number]][] = [["black",[0,0,0]],["white",[255,255,255]],["grey",[128,128,128]],["green",[0,255,0]]];
for (const [name, bg] of bgs) for (const fmt of ["png", "jpeg444", "jpeg420"]) {
  const d = base(bg, name === "grey" ? 3 : 1.5, name === "grey" ? 30 : 0);
  const faults: [number, number, number, (number|null)[], string][] = [
    [50, 50, 1, [255,255,255], "lit"], [100, 60, 2, [255,255,255], "lit"], [150, 70, 3, [255,255,255], "lit"],
    [60, 150, 1, [0,0,0], "dark"], [120, 160, 2, [0,0,0], "dark"], [200, 150, 3, [0,0,0], "dark"],
    [250, 50, 1, [255,null,null], "sub R on"], [300, 60, 1, [0,null,null], "sub R off"], [350, 70, 1, [null,null,255], "sub B on"], [260, 220, 1, [null,0,null], "sub G off"],
  ];
  for (const [x, y, sz, rgb] of faults) plant(d, x, y, sz, rgb);
  let img = sharp(d, { raw: { width: W, height: H, channels: 3 } });
  const buf = fmt === "png" ? await img.png().toBuffer() : await img.jpeg({ quality: 90, chromaSubsampling: fmt === "jpeg444" ? "4:4:4" : "4:2:0" }).toBuffer();
  const r = await suggestPixelCandidates(buf);
  const found = faults.map(([x, y, sz, , label]) => { const c = r.candidates.find(c => Math.hypot(c.x - (x + sz/2), c.y - (y + sz/2)) < 2); return `${label}:${c ? c.kind.replace("pixel-","") : "MISS"}`; });
  const extra = r.candidates.filter(c => !faults.some(([x, y, sz]) => Math.hypot(c.x - (x + sz/2), c.y - (y + sz/2)) < 2));
  console.log(name, fmt, "sigma", r.noiseSigma, "thr", r.seedThreshold, "n", r.candidates.length, "extra", extra.length, extra.map(e=>`${e.x},${e.y},${e.kind},${e.score},${e.areaPx}`), r.largeGroups);
  console.log("   ", found.join(" "));
}
