/**
 * Runs once when a server process starts (scripts/serve.ts, `next start`, `next dev`). A
 * production start without its secret stops there with the reason (instrumentation-node.ts),
 * before it answers anyone. The compute pool (lib/compute/pool.ts) then starts its first thread
 * now instead of on the first measurement, which would otherwise spend its time budget waiting
 * for the thread. The production server (scripts/serve.ts) finds the plain Node routes here
 * (lib/http/node-routes.ts): registered from inside the build, they run the same compiled code as
 * the app's handlers.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    await import("./instrumentation-node");
    const { warmCompute } = await import("@/lib/compute/pool");
    warmCompute();
    const { answerNodeRoute, findNodeRoute } = await import("@/lib/http/node-routes");
    (globalThis as Record<symbol, unknown>)[Symbol.for("partproof.nodeRoutes")] = { find: findNodeRoute, answer: answerNodeRoute };
  }
}
