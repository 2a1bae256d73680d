import { describe, expect, it } from "vitest";
import { waitPhrase } from "@/lib/rate-limit/limits";

describe("waitPhrase", () => {
  it("says seconds under a minute and rounds minutes up", () => {
    expect(waitPhrase(1)).toBe("Wait 1 second");
    expect(waitPhrase(40)).toBe("Wait 40 seconds");
    expect(waitPhrase(60)).toBe("Wait 1 minute");
    expect(waitPhrase(61)).toBe("Wait 2 minutes");
    expect(waitPhrase(900)).toBe("Wait 15 minutes");
  });
});
