import { createRequire } from "node:module";
import { describe, expect, it } from "vitest";
import { clientAddressFrom } from "./client-address";

const require = createRequire(import.meta.url);
const { appendPeer } = require("../../scripts/peer-address.cjs") as { appendPeer: (req: unknown) => void };

describe("client address behind TRUSTED_PROXY_HOPS (issue 17: X-Forwarded-For was trusted from anyone)", () => {
  it("ignores what a client writes into X-Forwarded-For when no proxy is trusted (the default)", () => {
    const req = { headers: { "x-forwarded-for": "198.51.100.9" }, socket: { remoteAddress: "::ffff:192.0.2.44" } };
    appendPeer(req);
    expect(req.headers["x-forwarded-for"]).toBe("198.51.100.9, 192.0.2.44");
    expect(clientAddressFrom(req.headers["x-forwarded-for"], 0)).toBe("192.0.2.44");
  });

  it("takes the entry the outermost trusted proxy appended", () => {
    // client forged 1.1.1.1; the real client 203.0.113.5 reached proxy A (appends it), then B, then the app.
    const chain = "1.1.1.1, 203.0.113.5, 10.0.0.2, 10.0.0.3";
    expect(clientAddressFrom(chain, 0)).toBe("10.0.0.3");
    expect(clientAddressFrom(chain, 2)).toBe("203.0.113.5");
    expect(clientAddressFrom("10.0.0.3", 3)).toBe("10.0.0.3");
    expect(clientAddressFrom(null, 0)).toBe("local");
    expect(clientAddressFrom(" , ", 1)).toBe("local");
  });

  it("leaves requests without a peer alone", () => {
    const req = { headers: {}, socket: {} } as { headers: Record<string, string>; socket: object };
    appendPeer(req);
    expect(req.headers["x-forwarded-for"]).toBeUndefined();
  });
});
