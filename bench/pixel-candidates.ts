/**
 * Speed and hit rate of suggestPixelCandidates on generated test-screen photos (mid grey with a
 * gradient, noise σ 3, JPEG q90 4:4:4, 24 planted faults). Prints figures; asserts nothing.
 * Run: npx tsx bench/pixel-candidates.ts
 */
import sharp from "sharp";
import { suggestPixelCandidates } from "@/lib/imaging/pixel-candidates";
import { mulberry32 as prng } from "@/tests/support/prng";


async function testScreen(width: number, height: number) {
  const random = prng(width);
  const data = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const ramp = 30 * (x / width - 0.5);
      for (let c = 0; c < 3; c++) {
        const n = 3 * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
        data[(y * width + x) * 3 + c] = Math.max(0, Math.min(255, Math.round(128 + ramp + n)));
      }
    }
  }
  const planted: [number, number][] = [];
  for (let k = 0; k < 24; k++) {
    const size = 1 + (k % 3);
    const x = Math.floor(((k % 6) + 0.5) * (width / 6));
    const y = Math.floor((Math.floor(k / 6) + 0.5) * (height / 4));
    const colour = [[255, 255, 255], [0, 0, 0], [255, null, null], [null, 0, null]][k % 4];
    for (let yy = y; yy < y + size; yy++) {
      for (let xx = x; xx < x + size; xx++) colour.forEach((v, c) => v !== null && (data[(yy * width + xx) * 3 + c] = v));
    }
    planted.push([x + size / 2, y + size / 2]);
  }
  const jpeg = await sharp(data, { raw: { width, height, channels: 3 } }).jpeg({ quality: 90, chromaSubsampling: "4:4:4" }).toBuffer();
  return { jpeg, planted };
}

for (const [width, height] of [[2000, 1500], [4000, 3000]]) {
  const { jpeg, planted } = await testScreen(width, height);
  const rss = process.memoryUsage().rss;
  const started = performance.now();
  const result = await suggestPixelCandidates(jpeg);
  const ms = performance.now() - started;
  const hit = (p: [number, number]) => result.candidates.some((c) => Math.hypot(c.x - p[0], c.y - p[1]) <= 1.5);
  const found = planted.filter(hit).length;
  const falseOnes = result.candidates.filter((c) => !planted.some((p) => Math.hypot(c.x - p[0], c.y - p[1]) <= 1.5)).length;
  console.log(
    `${width} × ${height} (${((width * height) / 1e6).toFixed(1)} MP): ${ms.toFixed(0)} ms, ` +
      `found ${found}/${planted.length}, false ${falseOnes}, RSS +${((process.memoryUsage().rss - rss) / 1e6).toFixed(0)} MB`,
  );
}
