import { describe, expect, it } from "vitest";
import { hashRecoveryCode, kindOfCode, matchTotp, newRecoveryCodes, newTotpSecret, totpCodeForStep, totpStepAt, totpUri } from "./two-factor";

// RFC 6238 Appendix B: the SHA-1 seed is the ASCII "12345678901234567890" (base32 below); the
// published 8-digit codes end in these 6 digits at the listed Unix times.
const RFC_SECRET = "GEZDGNBVGY3TQOJQGEZDGNBVGY3TQOJQ";
const RFC_VECTORS: [number, string][] = [
  [59, "287082"], // 94287082
  [1111111109, "081804"], // 07081804
  [1111111111, "050471"], // 14050471
  [1234567890, "005924"], // 89005924
  [2000000000, "279037"], // 69279037
];

describe("time-based codes", () => {
  it.each(RFC_VECTORS)("RFC 6238 Appendix B at T=%i s gives …%s", (t, code) => {
    expect(totpCodeForStep(RFC_SECRET, totpStepAt(t * 1000))).toBe(code);
  });

  it("accepts the current step and one either side, and nothing further", () => {
    const now = 1111111111 * 1000;
    const step = totpStepAt(now);
    for (const d of [-1, 0, 1]) expect(matchTotp(RFC_SECRET, totpCodeForStep(RFC_SECRET, step + d), now)).toBe(step + d);
    for (const d of [-3, -2, 2, 3]) expect(matchTotp(RFC_SECRET, totpCodeForStep(RFC_SECRET, step + d), now)).toBeNull();
  });

  it("refuses a code of a step already used (replay) and accepts a later one", () => {
    const now = 1234567890 * 1000;
    const step = totpStepAt(now);
    const code = totpCodeForStep(RFC_SECRET, step);
    expect(matchTotp(RFC_SECRET, code, now, step)).toBeNull();
    expect(matchTotp(RFC_SECRET, totpCodeForStep(RFC_SECRET, step + 1), now, step)).toBe(step + 1);
  });

  it("ignores spaces and refuses what is not six digits", () => {
    const now = 59_000;
    expect(matchTotp(RFC_SECRET, "287 082", now)).toBe(1);
    for (const bad of ["", "28708", "2870822", "28708a", "------"]) expect(matchTotp(RFC_SECRET, bad, now)).toBeNull();
  });

  it("makes base32 secrets of 20 bytes and an otpauth URI with the issuer", () => {
    const s = newTotpSecret();
    expect(s).toMatch(/^[A-Z2-7]{32}$/);
    expect(newTotpSecret()).not.toBe(s);
    const uri = new URL(totpUri("wren@ostrevane.example", s));
    expect(uri.protocol).toBe("otpauth:");
    expect(uri.searchParams.get("secret")).toBe(s);
    expect(uri.searchParams.get("issuer")).toBe("Layerwright");
  });
});

describe("recovery codes", () => {
  it("are ten distinct, readable codes whose hash ignores case and dashes", () => {
    const codes = newRecoveryCodes();
    expect(codes).toHaveLength(10);
    expect(new Set(codes).size).toBe(10);
    for (const c of codes) {
      expect(c).toMatch(/^[a-z2-9]{5}-[a-z2-9]{5}$/);
      expect(kindOfCode(c)).toBe("recovery");
      expect(hashRecoveryCode(c.toUpperCase().replace("-", " "))).toBe(hashRecoveryCode(c));
    }
    expect(kindOfCode("123456")).toBe("totp");
    expect(kindOfCode("12345")).toBeNull();
  });
});
