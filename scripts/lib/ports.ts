import net from "node:net";

/** True when nothing accepts connections on 127.0.0.1:port. */
export function isPortFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once("error", () => resolve(false));
    server.once("listening", () => server.close(() => resolve(true)));
    server.listen(port, "127.0.0.1");
  });
}

export function portTakenMessage(port: number, what: string, envVar: string): string {
  return `Port ${port} on 127.0.0.1 is already in use by another program, so ${what} cannot start there.\n` + `Stop that program, or choose another port: ${envVar}=<port> npm start`;
}

export async function waitFor(check: () => Promise<boolean>, { timeoutMs, intervalMs = 250, what }: { timeoutMs: number; intervalMs?: number; what: string }) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check().catch(() => false)) return;
    await new Promise((r) => setTimeout(r, intervalMs));
  }
  throw new Error(`${what} did not become ready within ${Math.round(timeoutMs / 1000)} s.`);
}
