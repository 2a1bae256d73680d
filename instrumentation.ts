/**
 * Runs once when a server process starts (scripts/serve.ts, `next start`, `next dev`). A
 * production start without its secret stops there with the reason (instrumentation-node.ts),
 * before it answers anyone. The compute pool (lib/compute/pool.ts) then starts its first thread
 * now instead of on the first measurement, which would otherwise spend its time budget waiting
 * for the thread.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    await import("./instrumentation-node");
    const { warmCompute } = await import("@/lib/compute/pool");
    warmCompute();
  }
}
