import { describe, expect, it } from "vitest";
import { clientIp } from "@/lib/auth/client-ip";

describe("clientIp", () => {
  it("takes the first X-Forwarded-For entry", () => {
    expect(clientIp(new Headers({ "x-forwarded-for": "198.51.100.4, 10.0.0.1" }))).toBe("198.51.100.4");
    expect(clientIp({})).toBe("unknown");
  });
});
