import { describe, expect, it } from "vitest";
import { minutesUntilRetry } from "@/lib/auth/retry";

describe("minutesUntilRetry", () => {
  it("counts from the oldest failure in the window", () => {
    const now = new Date("2026-12-01T10:00:00Z");
    expect(minutesUntilRetry(new Date("2026-12-01T09:50:00Z"), now, 15)).toBe(5);
    expect(minutesUntilRetry(new Date("2026-12-01T09:45:30Z"), now, 15)).toBe(1);
    expect(minutesUntilRetry(now, now, 15)).toBe(15);
  });
});
