/**
 * Runs once when a server process starts (`next start`, scripts/serve.ts, `next dev`): a
 * production start without its secret stops here with the reason (lib/production-check.ts),
 * before it answers anyone.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { productionStartProblems } = await import("./lib/production-check");
  const problems = productionStartProblems(process.env);
  if (problems.length) {
    console.error(`Partproof cannot start:\n${problems.map((p) => `  - ${p}`).join("\n")}`);
    process.exit(1);
  }
}
