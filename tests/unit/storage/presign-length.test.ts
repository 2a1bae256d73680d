import { createHash, createHmac } from "node:crypto";
import { S3Client } from "@aws-sdk/client-s3";
import { SignatureV4 } from "@smithy/signature-v4";
import { describe, expect, it } from "vitest";
import { createObjectStore, presignPut } from "@/lib/storage/s3";

type SourceData = string | ArrayBuffer | ArrayBufferView;
const bytes = (data: SourceData) => (typeof data === "string" ? Buffer.from(data) : ArrayBuffer.isView(data) ? Buffer.from(data.buffer, data.byteOffset, data.byteLength) : Buffer.from(data));

/** SHA-256 / HMAC-SHA-256 for the reference signer (its Checksum interface, on node:crypto). */
class NodeSha256 {
  private readonly hash;
  constructor(secret?: SourceData) {
    this.hash = secret ? createHmac("sha256", bytes(secret)) : createHash("sha256");
  }
  update(data: SourceData) {
    this.hash.update(bytes(data));
  }
  async digest() {
    return new Uint8Array(this.hash.digest());
  }
  reset() {}
}

const credentials = { accessKeyId: "AKIDEXAMPLE", secretAccessKey: "wJalrXUtnFEMI/K7MDENG+bPxRfiCYEXAMPLEKEY" };
const SIGNATURE_QUERY = ["X-Amz-Algorithm", "X-Amz-Credential", "X-Amz-Date", "X-Amz-Expires", "X-Amz-SignedHeaders", "X-Amz-Signature"];

/**
 * Re-signs the PUT a browser would send with `contentLength` bytes, with AWS's reference SigV4
 * signer (@smithy/signature-v4, what S3 verifies against), at the URL's own signing time: S3
 * accepts the upload only if this matches the signature in the URL.
 */
async function signatureForUpload(url: URL, contentLength: number): Promise<string> {
  const query = Object.fromEntries([...url.searchParams].filter(([k]) => !SIGNATURE_QUERY.includes(k)));
  const amzDate = url.searchParams.get("X-Amz-Date")!;
  const signingDate = new Date(`${amzDate.slice(0, 4)}-${amzDate.slice(4, 6)}-${amzDate.slice(6, 8)}T${amzDate.slice(9, 11)}:${amzDate.slice(11, 13)}:${amzDate.slice(13, 15)}Z`);
  const signer = new SignatureV4({ service: "s3", region: "eu-central-1", credentials, sha256: NodeSha256, uriEscapePath: false, applyChecksum: false });
  const signed = await signer.presign(
    {
      method: "PUT",
      protocol: url.protocol,
      hostname: url.hostname,
      port: url.port ? Number(url.port) : undefined,
      path: decodeURIComponent(url.pathname),
      query,
      headers: { host: url.host, "content-length": String(contentLength), "x-amz-content-sha256": url.searchParams.get("X-Amz-Content-Sha256")! },
    },
    // The payload hash (UNSIGNED-PAYLOAD) travels in the query already, as the SDK put it there.
    { signingDate, expiresIn: Number(url.searchParams.get("X-Amz-Expires")), unhoistableHeaders: new Set(["x-amz-content-sha256"]), unsignableHeaders: new Set(["x-amz-content-sha256"]) },
  );
  return (signed.query as Record<string, string>)["X-Amz-Signature"];
}

describe("presignPut", () => {
  const store = createObjectStore({ endpoint: "https://s3.eu-central-1.example.com", region: "eu-central-1", bucket: "partproof", ...credentials, forcePathStyle: true });

  it("signs the declared length, so S3 refuses a body of any other length", async () => {
    const url = new URL(await presignPut(store, "staging/ws/unit/photo", { contentType: "image/jpeg", contentLength: 1_234_567, expiresInSeconds: 900 }));
    expect(url.searchParams.get("X-Amz-SignedHeaders")).toBe("content-length;host");
    const given = url.searchParams.get("X-Amz-Signature");
    expect(await signatureForUpload(url, 1_234_567)).toBe(given);
    expect(await signatureForUpload(url, 1_234_568)).not.toBe(given);
    expect(await signatureForUpload(url, 40 * 1024 * 1024 + 1)).not.toBe(given);
  });

  it("uses the client this store was built with (no checksum of an empty body in the URL)", async () => {
    expect(store.client).toBeInstanceOf(S3Client);
    const url = new URL(await presignPut(store, "staging/x", { contentType: "image/png", contentLength: 10, expiresInSeconds: 60 }));
    expect(url.searchParams.has("x-amz-checksum-crc32")).toBe(false);
  });
});
