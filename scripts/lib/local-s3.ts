/**
 * s3rver as the local object store: one private bucket whose CORS rule lets only the app's own
 * origin PUT and GET through presigned URLs. The app itself only ever speaks S3 through
 * @aws-sdk/client-s3, so a real S3-compatible store replaces this by changing S3_* variables.
 */
import fs from "node:fs";
import http from "node:http";
import S3rver from "s3rver";
import { isPortFree, portTakenMessage } from "./ports";

export type LocalS3Options = { port: number; dir: string; bucket: string; allowedOrigins: string[] };

export function corsXml(origins: string[]): string {
  const originTags = origins.map((o) => `<AllowedOrigin>${o}</AllowedOrigin>`).join("");
  return (
    `<CORSConfiguration><CORSRule>${originTags}` +
    "<AllowedMethod>PUT</AllowedMethod><AllowedMethod>GET</AllowedMethod><AllowedMethod>HEAD</AllowedMethod>" +
    "<AllowedHeader>*</AllowedHeader><ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>3000</MaxAgeSeconds>" +
    "</CORSRule></CORSConfiguration>"
  );
}

/** True when an S3 endpoint answers on the port (an earlier start of ours, most likely). */
export function looksLikeS3(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const req = http.get({ host: "127.0.0.1", port, path: "/", timeout: 1500 }, (res) => {
      let body = "";
      res.on("data", (c) => (body += c));
      res.on("end", () => resolve(body.includes("ListAllMyBucketsResult")));
    });
    req.on("error", () => resolve(false));
    req.on("timeout", () => {
      req.destroy();
      resolve(false);
    });
  });
}

export type LocalS3Handle = { close: () => Promise<void>; reused: boolean };

export async function startLocalS3(opts: LocalS3Options, portEnvVar = "LOCAL_S3_PORT"): Promise<LocalS3Handle> {
  if (!(await isPortFree(opts.port))) {
    if (await looksLikeS3(opts.port)) return { reused: true, close: async () => {} };
    throw new Error(portTakenMessage(opts.port, "the local S3 store", portEnvVar));
  }
  fs.mkdirSync(opts.dir, { recursive: true });
  const server = new S3rver({
    address: "127.0.0.1",
    port: opts.port,
    directory: opts.dir,
    silent: true,
    configureBuckets: [{ name: opts.bucket, configs: [corsXml(opts.allowedOrigins)] }],
  });
  await server.run();
  return { reused: false, close: () => server.close() };
}
