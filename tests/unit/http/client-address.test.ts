import { describe, expect, it } from "vitest";
import { clientAddress, trustedProxyHops } from "@/lib/http/client-address";

// The rule (a, MDN "X-Forwarded-For", section "Selecting an IP address"): with a known number
// of trusted proxies, take the address that many entries from the right of the list the last
// proxy received plus its own peer; everything to the left of it can be written by the client.
describe("clientAddress", () => {
  it("with no trusted hops is the socket's peer, whatever the client wrote", () => {
    expect(clientAddress({ forwardedFor: "203.0.113.9", socketAddress: "198.51.100.7", trustedHops: 0 })).toBe("198.51.100.7");
    expect(clientAddress({ forwardedFor: undefined, socketAddress: "198.51.100.7", trustedHops: 0 })).toBe("198.51.100.7");
  });

  it("behind one proxy is the address that proxy appended (right-most entry)", () => {
    // The client sent "1.2.3.4" itself; the proxy appended the real peer 203.0.113.9.
    expect(clientAddress({ forwardedFor: "1.2.3.4, 203.0.113.9", socketAddress: "10.0.0.2", trustedHops: 1 })).toBe("203.0.113.9");
  });

  it("behind two proxies skips both of their entries", () => {
    expect(clientAddress({ forwardedFor: "6.6.6.6, 203.0.113.9, 10.0.0.5", socketAddress: "10.0.0.2", trustedHops: 2 })).toBe("203.0.113.9");
  });

  it("falls back to the left-most address when the chain is shorter than the hops", () => {
    expect(clientAddress({ forwardedFor: undefined, socketAddress: "127.0.0.1", trustedHops: 1 })).toBe("127.0.0.1");
    expect(clientAddress({ forwardedFor: "203.0.113.9", socketAddress: "10.0.0.2", trustedHops: 3 })).toBe("203.0.113.9");
  });

  it("joins repeated headers and ignores empty entries", () => {
    expect(clientAddress({ forwardedFor: ["1.2.3.4", " 203.0.113.9 ,"], socketAddress: "10.0.0.2", trustedHops: 1 })).toBe("203.0.113.9");
  });

  it("counts an IPv4-mapped IPv6 peer as the IPv4 address", () => {
    expect(clientAddress({ forwardedFor: undefined, socketAddress: "::ffff:127.0.0.1", trustedHops: 0 })).toBe("127.0.0.1");
    expect(clientAddress({ forwardedFor: undefined, socketAddress: "2001:DB8::1", trustedHops: 0 })).toBe("2001:db8::1");
  });

  it("says unknown when there is nothing at all", () => {
    expect(clientAddress({ forwardedFor: undefined, socketAddress: undefined, trustedHops: 0 })).toBe("unknown");
  });
});

describe("trustedProxyHops", () => {
  it("defaults to 0 and refuses anything but a small whole number", () => {
    expect(trustedProxyHops(undefined)).toBe(0);
    expect(trustedProxyHops("")).toBe(0);
    expect(trustedProxyHops("2")).toBe(2);
    expect(() => trustedProxyHops("-1")).toThrow(/whole number/);
    expect(() => trustedProxyHops("1.5")).toThrow(/whole number/);
    expect(() => trustedProxyHops("yes")).toThrow(/whole number/);
  });
});
