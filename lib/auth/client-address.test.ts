import { describe, expect, it } from "vitest";
import { clientAddressFrom } from "./client-address";

describe("client address from x-forwarded-for", () => {
  it.each([
    // The server appends the peer; with no proxy trusted, the peer is the client whatever was forged.
    ["203.0.113.9, 198.51.100.20", 0, "198.51.100.20"],
    ["198.51.100.20", 0, "198.51.100.20"],
    // One trusted proxy appended the client before the server appended the proxy.
    ["203.0.113.9, 198.51.100.20, 10.0.0.2", 1, "198.51.100.20"],
    ["::ffff:127.0.0.1", 0, "127.0.0.1"],
    ["2001:db8::1", 0, "2001:db8::1"],
    ["", 0, null],
    [null, 0, null],
    // Fewer entries than the trusted hops, or garbage: no address, never a shared key.
    ["10.0.0.2", 1, null],
    ["not an address", 0, null],
  ])("%s with %i trusted hops → %s", (header, hops, expected) => {
    expect(clientAddressFrom(header, hops)).toBe(expected);
  });
});
