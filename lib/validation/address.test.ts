import { describe, expect, it } from "vitest";
import { addressLines, addressSchema } from "./address";

const ok = { label: "Main yard", line1: "1 Slipway Road", city: "Harrowmere", region: "tx", postalCode: "75001", country: "us" };

describe("addressSchema", () => {
  it("accepts a US address and normalises the codes", () => {
    const r = addressSchema.parse(ok);
    expect(r).toMatchObject({ country: "US", region: "TX", postalCode: "75001", attention: null, line2: null });
  });
  it.each([
    [{ ...ok, region: "" }, "region", "Pick the state."],
    [{ ...ok, region: "ZZ" }, "region", "ZZ is not a state of United States."],
    [{ ...ok, postalCode: "7500" }, "postalCode", "A postal code in United States looks like five digits, or ZIP+4 (12345-6789)."],
    [{ ...ok, country: "XX" }, "country", "Pick a country from the list."],
    [{ ...ok, line1: " " }, "line1", "Enter the street address."],
    [{ ...ok, country: "CA", region: "ON", postalCode: "12345" }, "postalCode", "A postal code in Canada looks like A1A 1A1."],
  ])("refuses %o on %s", (input, path, message) => {
    const r = addressSchema.safeParse(input);
    expect(r.success).toBe(false);
    const issue = r.error!.issues.find((i) => i.path.join(".") === path);
    expect(issue?.message).toBe(message);
  });
  it("drops a region for a country without subdivisions and prints the lines", () => {
    const r = addressSchema.parse({ ...ok, country: "NL", region: "XX", postalCode: "1234 ab", attention: "Dock 4" });
    expect(r.region).toBeNull();
    expect(addressLines(r)).toEqual(["Attn: Dock 4", "1 Slipway Road", "Harrowmere, 1234 AB", "Netherlands"]);
  });
});
