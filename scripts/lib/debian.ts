import { execFileSync } from "node:child_process";
import fs from "node:fs";

export const isRoot = process.getuid?.() === 0;

/** Installs Debian packages when root; otherwise explains the exact command and stops. */
export function ensureDebianPackages(what: string, packages: string[], present: () => boolean) {
  if (present()) return;
  if (!isRoot) {
    throw new Error(`${what} is not installed. Install it with:\n  sudo apt-get update && sudo apt-get install -y ${packages.join(" ")}`);
  }
  console.log(`${what} is not installed; running apt-get install -y ${packages.join(" ")} …`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit", env });
  execFileSync("apt-get", ["install", "-y", "-qq", ...packages], { stdio: "inherit", env });
  if (!present()) throw new Error(`apt-get finished but ${what} is still missing.`);
}

export const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

export function ensureChromium() {
  ensureDebianPackages("Chromium (for the browser tests)", ["chromium", "fonts-dejavu-core"], () => fs.existsSync(CHROMIUM));
}
