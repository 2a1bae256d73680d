/**
 * Reads a byte stream to the end as a download would, and says what it cost this process: wall
 * time, CPU time, bytes, and the peak RSS growth (sampled every 5 ms and at every chunk). Shared by
 * the CSV benchmarks (reports.ts: csvStream alone; csv-export.ts: from PostgreSQL).
 */
export type StreamCost = { elapsed: number; cpu: number; bytes: number; growth: number; before: number; peak: number };

export async function readMeasured(stream: ReadableStream<Uint8Array>, onChunk: (chunk: Uint8Array) => void = () => {}): Promise<StreamCost> {
  const before = process.memoryUsage().rss;
  let peak = before;
  const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 5);
  const start = performance.now();
  const cpuStart = process.cpuUsage();
  let bytes = 0;
  try {
    const reader = stream.getReader();
    for (let next = await reader.read(); !next.done; next = await reader.read()) {
      bytes += next.value.byteLength;
      onChunk(next.value);
      peak = Math.max(peak, process.memoryUsage().rss);
    }
  } finally {
    clearInterval(sampler);
  }
  const elapsed = performance.now() - start;
  const cpu = process.cpuUsage(cpuStart);
  return { elapsed, cpu: (cpu.user + cpu.system) / 1000, bytes, growth: peak - before, before, peak };
}
