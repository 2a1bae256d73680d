import { describe, expect, it } from "vitest";
import { z } from "zod";
import { lotListAllowed, lotListParamsSchema } from "@/lib/lots/list-params";
import { defaultParams, listParamsSearch, readListParams } from "@/lib/url-state/list-params";

const SUPPLIER = "0b0e5f2e-7c1a-4d3e-9a51-3f5b2a1c9d01";
const OTHER_WORKSPACE_SUPPLIER = "5d6c8a5e-1f2b-4c3d-8e9f-0a1b2c3d4e5f";
const PART_TYPE = "7f3e2d1c-0b9a-4876-a543-210fedcba987";
const options = { suppliers: [{ id: SUPPLIER }], partTypes: [{ id: PART_TYPE }] };
const read = (raw: Record<string, string | string[] | undefined> | URLSearchParams) => readListParams(lotListParamsSchema, raw, { allowed: lotListAllowed(options) });

describe("readListParams", () => {
  it("reads a full Lots link, numbers coerced", () => {
    const { params, ignored } = read({ status: "open", supplierId: SUPPLIER, partTypeId: PART_TYPE, page: "2", pageSize: "10", sort: "purchaseRef", dir: "desc", search: "PO-24" });
    expect(ignored).toEqual([]);
    expect(params).toEqual({ status: "open", supplierId: SUPPLIER, partTypeId: PART_TYPE, page: 2, pageSize: 10, sort: "purchaseRef", dir: "desc", search: "PO-24" });
  });

  it("gives the defaults for an empty query string", () => {
    expect(read({})).toEqual({ params: { page: 1, pageSize: 20, sort: "dueOn", dir: "asc", status: "all" }, ignored: [] });
  });

  it("leaves out each bad value and keeps the good ones", () => {
    const { params, ignored } = read({ page: "two", pageSize: "7", status: "open", sort: "colour", supplierId: SUPPLIER });
    expect(ignored.sort()).toEqual(["page", "pageSize", "sort"]);
    expect(params).toMatchObject({ page: 1, pageSize: 20, sort: "dueOn", status: "open", supplierId: SUPPLIER });
  });

  it("leaves out unknown and repeated keys", () => {
    const raw = new URLSearchParams("status=open&status=decided&utm_source=mail&page=3");
    const { params, ignored } = read(raw);
    expect(ignored.sort()).toEqual(["status", "utm_source"]);
    expect(params).toMatchObject({ status: "all", page: 3 });
  });

  it("leaves out an id the screen does not offer (another workspace's supplier) and a malformed one", () => {
    const defaults = read({}).params;
    expect(read({ supplierId: OTHER_WORKSPACE_SUPPLIER, status: "open" })).toEqual({ params: { ...defaults, status: "open" }, ignored: ["supplierId"] });
    expect(read({ partTypeId: "not-an-id" })).toEqual({ params: defaults, ignored: ["partTypeId"] });
  });

  it("drops every key when a rule across keys fails without naming one", () => {
    const schema = z
      .object({ from: z.coerce.number().optional(), to: z.coerce.number().optional() })
      .strict()
      .refine((v) => v.from === undefined || v.to === undefined || v.from <= v.to);
    expect(readListParams(schema, { from: "5", to: "2" })).toEqual({ params: {}, ignored: ["from", "to"] });
  });

  it("refuses a schema that cannot hold an empty query string", () => {
    expect(() => defaultParams(z.object({ needed: z.string() }))).toThrow(/empty query string/);
  });
});

describe("listParamsSearch", () => {
  it("writes only what differs from the defaults, in the schema's order", () => {
    const { params } = read({ search: "PO 24", page: "2", status: "open" });
    expect(listParamsSearch(lotListParamsSchema, params)).toBe("?page=2&status=open&search=PO+24");
    expect(listParamsSearch(lotListParamsSchema, defaultParams(lotListParamsSchema))).toBe("");
  });

  it("round-trips: what it writes reads back to the same state", () => {
    const state = { page: 3, pageSize: 50 as const, sort: "supplier" as const, dir: "desc" as const, status: "decided" as const, supplierId: SUPPLIER, partTypeId: undefined, search: "ä&=?" };
    const written = listParamsSearch(lotListParamsSchema, state);
    const { partTypeId: _none, ...writtenState } = state;
    expect(read(new URLSearchParams(written.slice(1)))).toEqual({ params: writtenState, ignored: [] });
  });
});
