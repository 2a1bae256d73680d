/**
 * The production web server: Next.js's request handler behind a plain Node HTTP server (the
 * documented "custom server" form of `next start`). It exists for one reason: `next start`
 * passes a client's own X-Forwarded-For through untouched and only fills in the socket's
 * address when the header is missing, so per-address limits could be dodged by sending the
 * header. Here every request's X-Forwarded-For is replaced by the one client address worked out
 * from TRUSTED_PROXY_HOPS (lib/http/client-address.ts) before Next.js sees it, and forwarded
 * scheme/host headers are dropped unless a trusted proxy set them.
 *
 *   node --import tsx scripts/serve.ts   (PORT, HOST, NEXT_DIST_DIR, TRUSTED_PROXY_HOPS)
 */
import http from "node:http";
import next from "next";
import { clientAddress, trustedProxyHops } from "../lib/http/client-address";
import { projectRoot } from "./lib/settings";

const port = Number(process.env.PORT ?? 3000);
const hostname = process.env.HOST || "127.0.0.1";
const hops = trustedProxyHops(process.env.TRUSTED_PROXY_HOPS);

function normaliseForwarding(req: http.IncomingMessage) {
  req.headers["x-forwarded-for"] = clientAddress({ forwardedFor: req.headers["x-forwarded-for"], socketAddress: req.socket.remoteAddress, trustedHops: hops });
  if (hops === 0) {
    // Nobody in front of the app may vouch for these; Next.js fills them from the socket.
    delete req.headers["x-forwarded-proto"];
    delete req.headers["x-forwarded-host"];
    delete req.headers["x-forwarded-port"];
  }
}

/**
 * The plain Node routes (lib/http/node-routes.ts): a few hot read-only API routes answered here
 * without Next.js's request handling, which costs more CPU than their own work. instrumentation.ts
 * registers them from inside the build when Next.js prepares its server, which it does on the
 * first request it is given (the start script's health check); a request they do not match, and
 * any that comes before they are registered, goes to Next.js, which answers it the same way.
 */
type NodeRoutes = { find(method: string | undefined, url: string | undefined): unknown; answer(route: unknown, req: http.IncomingMessage, res: http.ServerResponse): Promise<void> };
const nodeRoutes = () => (globalThis as Record<symbol, NodeRoutes | undefined>)[Symbol.for("partproof.nodeRoutes")];

const app = next({ dev: false, dir: projectRoot, hostname, port });
await app.prepare();
const handle = app.getRequestHandler();
const upgrade = app.getUpgradeHandler();

/**
 * A route may answer before it has read the whole request body (413 while an oversized body is
 * still arriving, lib/http/route.ts). The rest of that body is still coming over the connection,
 * and nothing reads it any more (Next.js drops the request, and Node then stops reading the
 * socket): left open, the connection stalled, and the client's next request on it hung. Closing
 * it at once made a client that was still sending lose the answer to a reset (EPIPE before the
 * 413 was read). So the connection gets a lingering close (RFC 9112, 9.6): the sending side is
 * shut right after the answer, so the client sees the connection end and does not reuse it, and
 * the socket itself is destroyed a little later, once the client has had time to read the answer.
 */
const LINGER_MS = 2_000;

function lingerCloseWhenAnsweredEarly(req: http.IncomingMessage, res: http.ServerResponse) {
  const socket = req.socket;
  res.once("finish", () => {
    if (req.complete || socket.destroyed) return;
    socket.end();
    setTimeout(() => socket.destroy(), LINGER_MS).unref();
  });
}

const server = http.createServer((req, res) => {
  normaliseForwarding(req);
  lingerCloseWhenAnsweredEarly(req, res);
  const routes = nodeRoutes();
  const route = routes?.find(req.method, req.url);
  if (routes && route) {
    routes.answer(route, req, res).catch((err: unknown) => {
      console.error("Unexpected error in a plain Node route", err);
      if (!res.headersSent) res.writeHead(500, { "Content-Type": "application/json" }).end('{"error":{"code":"internal","message":"Something went wrong on the server. Try again."}}');
      else res.destroy();
    });
    return;
  }
  void handle(req, res);
});
server.on("upgrade", (req, socket, head) => {
  normaliseForwarding(req);
  void upgrade(req, socket, head);
});
// Longer than a load balancer's usual 60 s idle timeout, so it never reuses a closed connection.
server.keepAliveTimeout = 65_000;
server.listen(port, hostname, () => console.log(`Partproof listening on http://${hostname}:${port} (trusted proxy hops: ${hops})`));

const stop = () => {
  server.close(() => process.exit(0));
  server.closeIdleConnections();
  setTimeout(() => process.exit(0), 10_000).unref();
};
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
