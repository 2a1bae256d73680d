/**
 * What a production start must have (pure). The local demo may run on a secret that `npm start`
 * generated into .data/, but a server that people reach over the network must be given its
 * secret: a generated one differs per machine (sessions and upload tickets would not carry over
 * between instances) and lives in a data folder that backups and copies spread around.
 *
 * A start counts as production when NODE_ENV is production and APP_URL names a host other than
 * this machine's loopback, or when PARTPROOF_PRODUCTION=true says so explicitly.
 */
export function isLoopbackUrl(url: string): boolean {
  let host: string;
  try {
    host = new URL(url).hostname.toLowerCase();
  } catch {
    return false;
  }
  return host === "localhost" || host === "[::1]" || host === "::1" || /^127(\.\d{1,3}){3}$/.test(host);
}

export function isProductionStart(env: Record<string, string | undefined>): boolean {
  if (["true", "1"].includes((env.PARTPROOF_PRODUCTION ?? "").toLowerCase())) return true;
  return env.NODE_ENV === "production" && !isLoopbackUrl(env.APP_URL ?? "http://127.0.0.1:3000");
}

/** Why this environment must not start, or [] when it may. */
export function productionStartProblems(env: Record<string, string | undefined>): string[] {
  if (!isProductionStart(env)) return [];
  const problems: string[] = [];
  const why = env.PARTPROOF_PRODUCTION ? "PARTPROOF_PRODUCTION is set" : `APP_URL (${env.APP_URL}) is not a loopback address and NODE_ENV is production`;
  if (!env.NEXTAUTH_SECRET) {
    problems.push(
      `NEXTAUTH_SECRET is not set. This is a production start (${why}), so Partproof will not make up a secret: set NEXTAUTH_SECRET to the same long random value on every instance (e.g. \`openssl rand -base64 32\`).`,
    );
  } else if (env.NEXTAUTH_SECRET.length < 32) {
    problems.push(`NEXTAUTH_SECRET is shorter than 32 characters. This is a production start (${why}); use a long random value (e.g. \`openssl rand -base64 32\`).`);
  }
  return problems;
}
