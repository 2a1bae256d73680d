/**
 * `npm run bench`: runs each benchmark in bench/ one after another (each prints its own
 * figures). `npm run bench -- coverage` runs only the named ones.
 */
import fs from "node:fs";
import path from "node:path";
import { run, tsxArgs } from "./lib/children";
import { projectRoot } from "./lib/settings";

const wanted = process.argv.slice(2);
const benches = fs
  .readdirSync(path.join(projectRoot, "bench"))
  .filter((f) => f.endsWith(".ts") && !f.startsWith("_"))
  .map((f) => f.replace(/\.ts$/, ""))
  .filter((name) => wanted.length === 0 || wanted.includes(name));

let failed = 0;
for (const name of benches) {
  console.log(`\n━━ bench: ${name} ━━`);
  const [node, args] = tsxArgs(`bench/${name}.ts`);
  try {
    // MALLOC_ARENA_MAX=2 is how the photo worker runs (see lib/jobs); it lets sharp use 2 threads.
    await run(node, args, { label: name, env: { MALLOC_ARENA_MAX: "2" } });
  } catch (err) {
    failed++;
    console.error(err instanceof Error ? err.message : err);
  }
}
process.exit(failed ? 1 : 0);
