/**
 * Runs once when a server process starts (scripts/serve.ts, `next start`, `next dev`): a
 * production start without its secret stops there with the reason (instrumentation-node.ts),
 * before it answers anyone.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") await import("./instrumentation-node");
}
