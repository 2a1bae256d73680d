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

const app = next({ dev: false, dir: projectRoot, hostname, port });
await app.prepare();
const handle = app.getRequestHandler();
const upgrade = app.getUpgradeHandler();

/**
 * A route may answer before it has read the whole request body (413 while an oversized body is
 * still arriving, lib/http/route.ts). The rest of that body is still on its way over the
 * connection, so it cannot carry another request: the answer then says `Connection: close` and
 * the connection ends after it (RFC 9112, 9.6). Without this a client that reused the connection
 * hung on its next request.
 */
function closeIfBodyUnread(req: http.IncomingMessage, res: http.ServerResponse) {
  const writeHead = res.writeHead;
  res.writeHead = function (this: http.ServerResponse, ...args: Parameters<typeof writeHead>) {
    if (!req.complete && !this.headersSent) this.setHeader("Connection", "close");
    return writeHead.apply(this, args);
  } as typeof writeHead;
}

const server = http.createServer((req, res) => {
  normaliseForwarding(req);
  closeIfBodyUnread(req, res);
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
