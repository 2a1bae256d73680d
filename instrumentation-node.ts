/** The Node.js half of instrumentation.ts: refuse a production start that lacks its secret. */
import { productionStartProblems } from "./lib/production-check";

const problems = productionStartProblems(process.env);
if (problems.length) {
  console.error(`Partproof cannot start:\n${problems.map((p) => `  - ${p}`).join("\n")}`);
  process.exit(1);
}
