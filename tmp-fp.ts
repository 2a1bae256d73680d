import sharp from "sharp";
import { suggestPixelCandidates } from "@/lib/imaging/pixel-candidates";
let s = 11; const rnd = () => { s = (s * 16807) % 2147483647; return s / 2147483647; };
for (const [W, H, sd, grad, q, sub, blur] of [[2000, 1500, 3, 30, 85, "4:2:0", 0], [2000, 1500, 4, 40, 75, "4:2:0", 0], [2000,1500,3,30,0,"",0], [2000,1500,5,30,90,"4:4:4",0], [800,600,3,30,90,"4:4:4",0.8]] as const) {
  const d = Buffer.alloc(W * H * 3);
  for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) { const g = grad * (x / W - 0.5) + grad * 0.5 * (y / H - 0.5);
    for (let c = 0; c < 3; c++) { const n = Math.sqrt(-2*Math.log(rnd()))*Math.cos(2*Math.PI*rnd())*sd; d[(y*W+x)*3+c] = Math.max(0, Math.min(255, Math.round(128 + g + n))); } }
  // plant 3x3 faults for blurred case
  const planted: [number, number][] = [];
  if (blur) for (let k = 0; k < 10; k++) { const x = 50 + k * 70, y = 100 + (k % 3) * 150; planted.push([x + 1.5, y + 1.5]); for (let yy = y; yy < y + 3; yy++) for (let xx = x; xx < x + 3; xx++) for (let c = 0; c < 3; c++) d[(yy*W+xx)*3+c] = k % 2 ? 255 : 0; }
  let img = sharp(d, { raw: { width: W, height: H, channels: 3 } });
  if (blur) img = sharp(await img.blur(blur).raw().toBuffer(), { raw: { width: W, height: H, channels: 3 } });
  const buf = q ? await img.jpeg({ quality: q, chromaSubsampling: sub }).toBuffer() : await img.png().toBuffer();
  const t = performance.now();
  const r = await suggestPixelCandidates(buf);
  const found = planted.filter(([x, y]) => r.candidates.some(c => Math.hypot(c.x - x, c.y - y) < 2)).length;
  console.log(W, H, sd, q, sub, blur, "ms", (performance.now() - t).toFixed(0), "sigma", r.noiseSigma, "thr", r.seedThreshold, "n", r.candidates.length, "found", found, "/", planted.length, r.candidates.slice(0, 3), r.droppedAsRinging, r.largeGroups);
}
