/**
 * The delivery state in words (lot page, supplier page, Outbox): each state the worker leaves a
 * row in (lib/mail/deliver.ts: queued after a refused attempt, sent, failed on the last attempt).
 */
import { describe, expect, it } from "vitest";
import { deliveryText } from "@/lib/mail/delivery-text";

const REFUSED = "connect ECONNREFUSED 127.0.0.1:2535";

describe("deliveryText", () => {
  it("says queued before the first attempt, and retrying with the server's answer after refused ones", () => {
    expect(deliveryText({ status: "queued", attempts: 0, error: null })).toBe("queued");
    expect(deliveryText({ status: "queued", attempts: 1, error: REFUSED })).toBe(`queued, retrying (1 attempt so far: ${REFUSED})`);
    expect(deliveryText({ status: "queued", attempts: 3, error: REFUSED })).toBe(`queued, retrying (3 attempts so far: ${REFUSED})`);
  });

  it("says sent, and after how many attempts when it was retried", () => {
    expect(deliveryText({ status: "sent", attempts: 1, error: null })).toBe("sent");
    expect(deliveryText({ status: "sent", attempts: 4, error: null })).toBe("sent, after 4 attempts");
  });

  it("says failed with the reason", () => {
    expect(deliveryText({ status: "failed", attempts: 15, error: REFUSED })).toBe(`failed, after 15 attempts: ${REFUSED}`);
    expect(deliveryText({ status: "failed", attempts: 1, error: "The queued message could not be read back" })).toBe("failed: The queued message could not be read back");
  });
});
