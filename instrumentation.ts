/**
 * Runs once when the server starts. The compute pool (lib/compute/pool.ts) starts its first
 * thread now instead of on the first measurement, which would otherwise spend its time budget
 * waiting for the thread.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { warmCompute } = await import("@/lib/compute/pool");
  warmCompute();
}
