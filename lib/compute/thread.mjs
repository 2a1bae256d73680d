// Entry of one compute thread (lib/compute/pool.ts). The app's sources are TypeScript: the thread
// registers tsx's loader first — the job worker runs the same way (`node --import tsx`) — so the
// tasks run the very modules the tests check, with no second build. The cwd is the project root
// (as for `next start` and the worker), where tsx finds tsconfig.json and its "@/" paths.
import { register } from "tsx/esm/api";

register();
const { runTask } = await import("./tasks.ts");

/** Piscina calls this once per task. */
export default function run({ name, input }) {
  return runTask(name, input);
}
