import { describe, expect, it } from "vitest";
import { normaliseAddress, resolveClientAddress, trustedProxyList } from "@/lib/auth/client-address";

/*
 * OWASP Authentication Cheat Sheet (throttling must not trust what the client says) and the
 * X-Forwarded-For convention that each proxy appends the address it received the request from
 * (RFC 7239 §5.2 describes the same rule for its standard Forwarded header: "for" of each hop).
 * Addresses are from the documentation ranges of RFC 5737 and RFC 3849.
 */
describe("the client address for sign-in limits (OWASP Authentication Cheat Sheet)", () => {
  const none = trustedProxyList([]);
  const proxies = trustedProxyList(["10.0.0.0/8", "2001:db8:ffff::/48", "192.0.2.1"]);

  it("ignores X-Forwarded-For entirely when no proxy is trusted: the connection's address decides", () => {
    expect(resolveClientAddress("198.51.100.20", "203.0.113.7", none)).toBe("198.51.100.20");
    expect(resolveClientAddress("198.51.100.20", "203.0.113.7, 10.1.1.1", none)).toBe("198.51.100.20");
  });

  it("ignores X-Forwarded-For from a connection that is not a listed proxy", () => {
    expect(resolveClientAddress("198.51.100.20", "203.0.113.7", proxies)).toBe("198.51.100.20");
  });

  it("behind listed proxies reads the hops from the right and stops at the first that is not a proxy", () => {
    // The client wrote "203.0.113.66" itself; the outer proxy appended what it saw (198.51.100.9).
    expect(resolveClientAddress("10.0.0.5", "203.0.113.66, 198.51.100.9", proxies)).toBe("198.51.100.9");
    expect(resolveClientAddress("10.0.0.5", "203.0.113.66, 198.51.100.9, 10.2.3.4, 192.0.2.1", proxies)).toBe("198.51.100.9");
    expect(resolveClientAddress("2001:db8:ffff::2", "2001:db8:1::77", proxies)).toBe("2001:db8:1::77");
  });

  it("never goes past rubbish a client wrote, and falls back to the proxy when no hop is given", () => {
    expect(resolveClientAddress("10.0.0.5", "not-an-address, 10.0.0.9", proxies)).toBe("10.0.0.9");
    expect(resolveClientAddress("10.0.0.5", null, proxies)).toBe("10.0.0.5");
    expect(resolveClientAddress(null, "203.0.113.7", proxies)).toBe("unknown");
  });

  it("reads IPv4-mapped IPv6 as the IPv4 address and refuses what is not an address", () => {
    expect(normaliseAddress("::ffff:198.51.100.20")).toBe("198.51.100.20");
    expect(normaliseAddress("[2001:DB8::1]")).toBe("2001:db8::1");
    expect(normaliseAddress("198.51.100.20, 10.0.0.1")).toBeNull();
    expect(normaliseAddress("localhost")).toBeNull();
  });
});
