import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";

/** NEXTAUTH_SECRET from the environment, else one generated once and kept in the data folder. */
export function sessionSecret(dataDir: string): string {
  if (process.env.NEXTAUTH_SECRET) return process.env.NEXTAUTH_SECRET;
  const file = path.join(dataDir, "session-secret");
  if (fs.existsSync(file)) return fs.readFileSync(file, "utf8").trim();
  fs.mkdirSync(dataDir, { recursive: true });
  const secret = crypto.randomBytes(32).toString("base64url");
  fs.writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}
