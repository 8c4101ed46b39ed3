import { describe, expect, it } from "vitest";
import { clientAddress, PEER_HEADER } from "./client-address";

const h = (peer: string | null, xff?: string) => {
  const headers = new Headers();
  if (peer) headers.set(PEER_HEADER, peer);
  if (xff !== undefined) headers.set("x-forwarded-for", xff);
  return headers;
};

describe("the client address a rate limit is keyed on", () => {
  it("is the socket address when no proxy is trusted, whatever X-Forwarded-For says", () => {
    expect(clientAddress(h("203.0.113.9", "1.1.1.1"), [])).toBe("203.0.113.9");
    expect(clientAddress(h("203.0.113.9", "1.1.1.1, 2.2.2.2"), [])).toBe("203.0.113.9");
    expect(clientAddress(h("::ffff:203.0.113.9"), [])).toBe("203.0.113.9");
  });

  it("reads X-Forwarded-For from the right, through trusted proxies only", () => {
    // The client forged "6.6.6.6"; our proxy (10.0.0.2) appended the real client 198.51.100.7.
    expect(clientAddress(h("10.0.0.2", "6.6.6.6, 198.51.100.7"), ["10.0.0.2"])).toBe("198.51.100.7");
    // Two of our proxies in a row.
    expect(clientAddress(h("10.0.0.2", "6.6.6.6, 198.51.100.7, 10.0.0.3"), ["10.0.0.2", "10.0.0.3"])).toBe(
      "198.51.100.7",
    );
    // A peer that is not our proxy: its header is not believed.
    expect(clientAddress(h("198.51.100.50", "6.6.6.6"), ["10.0.0.2"])).toBe("198.51.100.50");
  });

  it("without the recorded socket address, uses the right-most entry (Next's own, when the client sent none)", () => {
    expect(clientAddress(h(null, "127.0.0.1"), [])).toBe("127.0.0.1");
    expect(clientAddress(h(null), [])).toBe("unknown");
  });

  it("a forged peer header from the client is overwritten by the server (see instrumentation.ts), so only the address shapes matter here", () => {
    expect(clientAddress(h("[2001:db8::1]:443"), [])).toBe("2001:db8::1");
    expect(clientAddress(h("192.0.2.1:5000"), [])).toBe("192.0.2.1");
  });
});
