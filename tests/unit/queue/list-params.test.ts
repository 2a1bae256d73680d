import { describe, expect, it } from "vitest";
import { encodeCursor, readCursor } from "@/lib/queue/cursor";
import { QUEUE_LIST_PAGE_KEYS, queueApiSearch, queueListAllowed, queueListParamsSchema } from "@/lib/queue/list-params";
import { listParamsSearch, readListParams } from "@/lib/url-state/list-params";

const LOT = "3c1d2e4f-5a6b-4c7d-8e9f-a0b1c2d3e4f5";
const key = { dueOn: "2026-11-27", receivedOn: "2026-11-20", lotCreatedAt: "2026-11-20T08:15:02.123456Z", lotId: LOT, sampleIndex: 7, id: "9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d" };
const options = { partTypes: [], suppliers: [], lots: [{ id: LOT, label: "PO-1" }] };
const read = (query: string) => readListParams(queueListParamsSchema, new URLSearchParams(query), { allowed: queueListAllowed(options) });

describe("queue cursors", () => {
  it("read back what the server wrote, without Node's Buffer (the browser reads them too)", () => {
    expect(readCursor(encodeCursor(key))).toEqual(key);
    expect(readCursor("garbage")).toBeNull();
    expect(readCursor(encodeCursor({ ...key, sampleIndex: -1 }))).toBeNull();
  });
});

describe("the Queue's URL state", () => {
  const cursor = encodeCursor(key);

  it("reads filters with a later page", () => {
    expect(read(`lotId=${LOT}&cursor=${cursor}&page=2`)).toEqual({ params: { lotId: LOT, cursor, page: 2 }, ignored: [] });
  });

  it("falls back to the first page for a cursor that is not ours, a page number without a cursor, or a cursor without a number", () => {
    expect(read("cursor=garbage&page=2")).toEqual({ params: {}, ignored: ["cursor", "page"] });
    expect(read("page=3")).toEqual({ params: {}, ignored: ["page"] });
    expect(read(`before=${cursor}`)).toEqual({ params: {}, ignored: ["before"] });
    expect(read(`cursor=${cursor}&before=${cursor}&page=4`)).toEqual({ params: { cursor, page: 4 }, ignored: ["before"] });
  });

  it("leaves out a lot that is not open in this workspace", () => {
    expect(read("lotId=11111111-2222-4333-8444-555555555555")).toEqual({ params: {}, ignored: ["lotId"] });
  });

  it("sends the API the filters and cursor but not the page number", () => {
    const params = { lotId: LOT, before: cursor, page: 3 };
    expect(queueApiSearch(params)).toBe(`?lotId=${LOT}&before=${cursor}`);
    expect(listParamsSearch(queueListParamsSchema, params)).toBe(`?lotId=${LOT}&before=${cursor}&page=3`);
  });
});

describe("a link whose filter is left out", () => {
  it("opens on the first page: its cursor belonged to the filtered list", () => {
    const cursor = encodeCursor(key);
    const closedLot = "11111111-2222-4333-8444-555555555555";
    const { params, ignored } = readListParams(queueListParamsSchema, new URLSearchParams(`lotId=${closedLot}&cursor=${cursor}&page=2`), {
      allowed: queueListAllowed(options),
      pageKeys: QUEUE_LIST_PAGE_KEYS,
    });
    expect(params).toEqual({});
    expect(ignored).toEqual(["lotId", "cursor", "page"]);
  });
});
