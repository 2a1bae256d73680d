import { describe, expect, it } from "vitest";
import { canDecodeHeic, MAX_PHOTO_BYTES } from "@/lib/imaging/normalize";
import { checkDeclaredUpload, checkStoredUpload } from "@/lib/photos/precheck";
import { makeFtypFile, makePhotoLikeJpeg } from "@/support/fixtures/make-photos";

const declared = (bytes: number, contentType = "image/jpeg") => checkDeclaredUpload({ bytes, contentType })?.code ?? null;

describe("the declared size and type, before any byte is uploaded", () => {
  it("refuses empty and oversized files; the limit itself is allowed", () => {
    expect(declared(0)).toBe("empty");
    expect(declared(MAX_PHOTO_BYTES)).toBeNull();
    expect(declared(MAX_PHOTO_BYTES + 1)).toBe("too_large");
  });

  it("refuses types that are not photos, and lets unknown ones through to the byte sniff", () => {
    expect(declared(10, "image/svg+xml")).toBe("unsupported_format");
    expect(declared(10, "application/pdf")).toBe("unsupported_format");
    expect(declared(10, "text/plain; charset=utf-8")).toBe("unsupported_format");
    expect(declared(10, "image/gif")).toBe("unsupported_format");
    expect(declared(10, "")).toBeNull();
    expect(declared(10, "application/octet-stream")).toBeNull();
    expect(declared(10, "image/jpeg")).toBeNull();
    expect(declared(10, "IMAGE/PNG")).toBeNull();
    expect(declared(10, "image/heic")).toBe(canDecodeHeic() ? null : "unsupported_format");
  });
});

describe("what actually arrived in the store", () => {
  it("takes the MIME type from the first bytes, not from the browser", async () => {
    const jpeg = await makePhotoLikeJpeg({ width: 32, height: 24 });
    expect(checkStoredUpload({ bytes: jpeg.length, head: jpeg.subarray(0, 4096) })).toEqual({ ok: true, contentType: "image/jpeg" });
  });

  it("refuses SVG, text and HEIC (without a HEVC decoder) by their bytes", () => {
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>');
    const result = checkStoredUpload({ bytes: svg.length, head: svg });
    expect(result.ok).toBe(false);
    expect(!result.ok && result.rejection.message).toMatch(/SVG drawing/);
    expect(checkStoredUpload({ bytes: 5, head: Buffer.from("hello") }).ok).toBe(false);
    const heic = makeFtypFile("heic", ["mif1", "heic"]);
    expect(checkStoredUpload({ bytes: heic.length, head: heic }).ok).toBe(canDecodeHeic());
    expect(checkStoredUpload({ bytes: 0, head: Buffer.alloc(0) })).toMatchObject({ ok: false, rejection: { code: "empty" } });
  });
});
