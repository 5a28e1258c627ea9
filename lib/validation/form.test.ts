import { describe, expect, it } from "vitest";
import { z } from "zod";
import { fieldErrorsOf, formField } from "./form";

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

  it("reads a posted field, and nothing from what is not a form", () => {
    const fd = new FormData();
    fd.set("token", "abc");
    expect(formField(fd, "token")).toBe("abc");
    expect(formField(fd, "other")).toBeNull();
    expect(formField({ token: "abc" }, "token")).toBeUndefined();
  });
});
