/**
 * parseJson reads a request body as a stream with a byte counter (lib/http/route.ts): 413 as
 * soon as the limit is passed — the rest is never pulled — with or without a Content-Length.
 */
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { parseJson } from "@/lib/http/route";

/** A chunked body of `total` bytes (64 KB chunks of JSON whitespace) that counts what was pulled. */
function countingRequest(total: number, headers: Record<string, string> = {}) {
  const chunk = new Uint8Array(64 * 1024).fill(0x20);
  let pulled = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (pulled >= total) return controller.close();
      pulled += chunk.length;
      controller.enqueue(chunk);
    },
  });
  const req = new Request("http://app.test/api/x", { method: "POST", body, headers: { "content-type": "application/json", ...headers }, duplex: "half" } as RequestInit);
  return { req, pulled: () => pulled };
}

const schema = z.strictObject({ a: z.number() });
const failure = (promise: Promise<unknown>) =>
  promise.then(
    () => null,
    (err: unknown) => err,
  );

describe("parseJson", () => {
  it("answers 413 once the counter passes the limit, without pulling the rest of a chunked body", async () => {
    const total = 64 * 1024 * 1024;
    const { req, pulled } = countingRequest(total);
    const err = await failure(parseJson(req, schema, { maxBytes: 1024 * 1024 }));
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).status).toBe(413);
    expect((err as AppError).message).toBe("The request is too large (limit 1024 KB).");
    // One chunk past the limit at most (plus what the stream may buffer ahead), not 64 MB.
    expect(pulled()).toBeLessThanOrEqual(1024 * 1024 + 4 * 64 * 1024);
  });

  it("refuses a declared Content-Length over the limit before reading anything", async () => {
    const { req, pulled } = countingRequest(8 * 1024 * 1024, { "content-length": String(8 * 1024 * 1024) });
    expect(((await failure(parseJson(req, schema, { maxBytes: 16 * 1024 }))) as AppError).status).toBe(413);
    expect(pulled()).toBeLessThanOrEqual(64 * 1024);
  });

  it("reads a body within the limit, refuses invalid UTF-8 and JSON with a sentence, and allows an empty body when asked", async () => {
    const ok = new Request("http://app.test/api/x", { method: "POST", body: '  {"a": 1}  ' });
    await expect(parseJson(ok, schema)).resolves.toEqual({ a: 1 });
    const latin1 = new Request("http://app.test/api/x", { method: "POST", body: new Uint8Array([0x7b, 0x22, 0xe9, 0x22, 0x7d]) });
    expect(((await failure(parseJson(latin1, schema))) as AppError).message).toBe("The request body is not valid JSON (UTF-8 text).");
    const empty = new Request("http://app.test/api/x", { method: "POST" });
    await expect(parseJson(empty, z.strictObject({ a: z.number().optional() }), { allowEmpty: true })).resolves.toEqual({});
    expect(((await failure(parseJson(new Request("http://app.test/api/x", { method: "POST", body: " " }), schema))) as AppError).status).toBe(400);
  });
});
