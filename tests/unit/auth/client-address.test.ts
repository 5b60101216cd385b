import { describe, expect, it } from "vitest";
import { clientAddress, parseTrustedProxies } from "@/lib/auth/client-address";

// X-Forwarded-For semantics: each proxy appends the address it received the request from
// (MDN "X-Forwarded-For"; HAProxy 2.6 configuration manual, `option forwardfor`).
describe("clientAddress", () => {
  const frontDoor = parseTrustedProxies("127.0.0.1");

  it("behind the front door, takes the address the front door appended, not what the client wrote", () => {
    expect(clientAddress({ "x-forwarded-for": "203.0.113.9, 198.51.100.7" }, frontDoor)).toBe("198.51.100.7");
    expect(clientAddress({ "x-forwarded-for": "10.9.9.9" }, frontDoor)).toBe("10.9.9.9");
  });

  it("skips every trusted proxy from the right, so two proxies in a row still find the client", () => {
    const proxies = parseTrustedProxies("10.0.0.2, 10.0.0.3");
    expect(clientAddress({ "x-forwarded-for": "1.2.3.4, 198.51.100.7, 10.0.0.2" }, proxies)).toBe("198.51.100.7");
  });

  it("a client cannot change its bucket by rotating the header: the rightmost untrusted entry stays its own", () => {
    const seen = new Set(
      Array.from({ length: 21 }, (_, i) =>
        clientAddress({ "x-forwarded-for": `203.0.113.${i}, 198.51.100.7` }, frontDoor),
      ),
    );
    expect([...seen]).toEqual(["198.51.100.7"]);
  });

  it("treats an IPv4-mapped IPv6 address as the IPv4 one (Node reports loopback as ::ffff:127.0.0.1)", () => {
    expect(clientAddress({ "x-forwarded-for": "198.51.100.7, ::ffff:127.0.0.1" }, frontDoor)).toBe("198.51.100.7");
  });

  it("without a header says unknown; with only trusted entries, the leftmost", () => {
    expect(clientAddress({}, frontDoor)).toBe("unknown");
    expect(clientAddress({ "x-forwarded-for": "127.0.0.1" }, frontDoor)).toBe("127.0.0.1");
  });
});
