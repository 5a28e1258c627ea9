import { describe, expect, it } from "vitest";
import { z } from "zod";
import { fieldErrorsOf, nestedFields } from "./form";

describe("form helpers", () => {
  it("groups zod issues by top-level field, the whole form under 'form'", () => {
    const schema = z.object({ name: z.string().min(2), password: z.string().min(12) }).refine((v) => v.name !== v.password, { message: "The password must not be your name." });
    const bad = schema.safeParse({ name: "x", password: "short" });
    expect(bad.success).toBe(false);
    const errors = fieldErrorsOf(bad.error!);
    expect(Object.keys(errors).sort()).toEqual(["name", "password"]);
    const same = schema.safeParse({ name: "long enough name", password: "long enough name" });
    expect(fieldErrorsOf(same.error!)).toEqual({ form: ["The password must not be your name."] });
  });

  it("turns dotted field names into nested groups, and leaves what is not a record alone", () => {
    expect(nestedFields({ name: "Ada", "address.city": "Fennick Cross", "address.postalCode": "55990" })).toEqual({ name: "Ada", address: { city: "Fennick Cross", postalCode: "55990" } });
    expect(nestedFields(null)).toBeNull();
    expect(nestedFields("x")).toBe("x");
  });
});
