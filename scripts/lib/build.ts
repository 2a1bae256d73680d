/**
 * Production build only when the sources changed since the last one: a hash of every file that
 * goes into the build is stored next to it.
 */
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { projectRoot } from "./settings";
import { run } from "./children";

const BUILD_INPUTS = [
  "app",
  "components",
  "lib",
  "db",
  "public",
  "types",
  "proxy.ts",
  "instrumentation.ts",
  "instrumentation-node.ts",
  "instrumentation-client.ts",
  "next.config.ts",
  "postcss.config.mjs",
  "tsconfig.json",
  "package-lock.json",
];
const SKIP = new Set(["node_modules", ".next", ".next-test", ".data", "migrations"]);

function listFiles(entry: string, out: string[]) {
  const full = path.join(projectRoot, entry);
  if (!fs.existsSync(full)) return;
  const stat = fs.statSync(full);
  if (stat.isFile()) {
    out.push(entry);
    return;
  }
  for (const name of fs.readdirSync(full).sort()) {
    if (SKIP.has(name) || name.startsWith(".")) continue;
    listFiles(path.join(entry, name), out);
  }
}

export function sourceHash(): string {
  const files: string[] = [];
  for (const entry of BUILD_INPUTS) listFiles(entry, files);
  const hash = crypto.createHash("sha256");
  for (const file of files) {
    hash.update(file);
    hash.update(fs.readFileSync(path.join(projectRoot, file)));
  }
  return hash.digest("hex");
}

export async function buildIfStale({ distDir, env }: { distDir: string; env: Record<string, string> }): Promise<boolean> {
  const marker = path.join(projectRoot, distDir, "partproof-build.sha256");
  const hash = sourceHash();
  const current = fs.existsSync(path.join(projectRoot, distDir, "BUILD_ID")) && fs.existsSync(marker) && fs.readFileSync(marker, "utf8") === hash;
  if (current) return false;
  console.log(`Building the production app into ${distDir} (sources changed or no build yet) …`);
  await run(process.execPath, ["node_modules/next/dist/bin/next", "build"], { env: { ...env, NEXT_DIST_DIR: distDir }, label: "build" });
  fs.writeFileSync(marker, hash);
  return true;
}
