import { describe, expect, it } from "vitest";
import { clientAddressOf, parseTrustedProxies } from "@/lib/server/client-address";

describe("clientAddressOf(socket, X-Forwarded-For, trusted)", () => {
  const none = parseTrustedProxies(undefined);
  const proxy = parseTrustedProxies("10.0.0.5, 10.0.0.6");

  it("clientAddressOf ignores a forged X-Forwarded-For when no proxy is trusted", () => {
    expect(clientAddressOf("203.0.113.9", "198.51.100.1", none)).toBe("203.0.113.9");
    expect(clientAddressOf("::ffff:127.0.0.1", ["1.2.3.4", "5.6.7.8"], none)).toBe("127.0.0.1");
    expect(clientAddressOf(undefined, "1.2.3.4", none)).toBe("unknown");
  });

  it("clientAddressOf ignores X-Forwarded-For from a socket that is not a trusted proxy", () => {
    expect(clientAddressOf("203.0.113.9", "198.51.100.1", proxy)).toBe("203.0.113.9");
  });

  it("clientAddressOf behind trusted proxies takes the right-most hop that is not one of them", () => {
    expect(clientAddressOf("10.0.0.5", "198.51.100.1", proxy)).toBe("198.51.100.1");
    // A client forging a left-hand hop does not get it believed.
    expect(clientAddressOf("10.0.0.5", "6.6.6.6, 198.51.100.1", proxy)).toBe("198.51.100.1");
    expect(clientAddressOf("10.0.0.5", "6.6.6.6, 198.51.100.1, 10.0.0.6", proxy)).toBe("198.51.100.1");
    expect(clientAddressOf("10.0.0.5", "", proxy)).toBe("10.0.0.5");
  });
});
