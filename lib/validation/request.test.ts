import { describe, expect, it } from "vitest";
import { acceptQuoteSchema, billingSchema, draftSchema, listQuerySchema, partSchema, partToRow, projectSchema, submitSchema, toDraftFields } from "./request";

const project = { projectName: "Wing rib tool", neededBy: "2027-03-15", cureProcess: "autoclave", cureTemp: 350, cureTempUnit: "F", isControlled: false, notes: "" } as const;
const part = { id: "p1", name: "Rib tool", materialKey: "pesu-cf", allowance: 0.25, quantity: 1, printMode: "solid", units: "in", unitsConfirmed: true, cellKey: "" } as const;

describe("projectSchema", () => {
  it("accepts a full project and stores °C", () => {
    const v = projectSchema.parse(project);
    const f = toDraftFields(v);
    // 350 °F = 176.7 °C (NIST SP 811: t/°C = (t/°F − 32)/1.8)
    expect(f.cureTempC).toBe(176.7);
    expect(f.neededBy?.toISOString()).toBe("2027-03-15T00:00:00.000Z");
  });
  it("asks for the temperature of an oven or autoclave cure", () => {
    const r = projectSchema.safeParse({ ...project, cureTemp: "" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["cureTemp"]);
    expect(projectSchema.safeParse({ ...project, cureProcess: "room", cureTemp: "" }).success).toBe(true);
  });
  it("refuses absurd temperatures in either unit", () => {
    expect(projectSchema.safeParse({ ...project, cureTemp: 900, cureTempUnit: "F" }).success).toBe(false); // 482 °C
    expect(projectSchema.safeParse({ ...project, cureTemp: 800, cureTempUnit: "F" }).success).toBe(true); // 427 °C
    expect(projectSchema.safeParse({ ...project, cureTemp: 451, cureTempUnit: "C" }).success).toBe(false);
  });
  it("refuses a short name and a non-date", () => {
    expect(projectSchema.safeParse({ ...project, projectName: " x " }).success).toBe(false);
    expect(projectSchema.safeParse({ ...project, neededBy: "2027-02-30x" }).success).toBe(false);
    expect(projectSchema.safeParse({ ...project, neededBy: "" }).success).toBe(true);
  });
});

describe("partSchema", () => {
  it("converts an inch allowance to millimetres (25.4 mm/in exactly, NIST SP 811)", () => {
    expect(partToRow(partSchema.parse(part)).allowanceMm).toBe(6.35);
    expect(partToRow(partSchema.parse({ ...part, units: "mm", allowance: 5 })).allowanceMm).toBe(5);
  });
  it("coerces form strings and refuses bad quantities", () => {
    expect(partSchema.parse({ ...part, quantity: "3", allowance: "0.5" }).quantity).toBe(3);
    expect(partSchema.safeParse({ ...part, quantity: 0 }).success).toBe(false);
    expect(partSchema.safeParse({ ...part, quantity: 1.5 }).success).toBe(false);
    expect(partSchema.safeParse({ ...part, allowance: -1 }).success).toBe(false);
  });
});

describe("draft and submit", () => {
  it("a draft may have no parts and unconfirmed units; a submission may not", () => {
    expect(draftSchema.safeParse({ project, parts: [] }).success).toBe(true);
    expect(draftSchema.safeParse({ project, parts: [{ ...part, unitsConfirmed: false }] }).success).toBe(true);
    expect(submitSchema.safeParse({ requestId: "r", project, parts: [] }).success).toBe(false);
    const r = submitSchema.safeParse({ requestId: "r", project, parts: [{ ...part, unitsConfirmed: false }] });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["parts", 0, "unitsConfirmed"]);
    expect(submitSchema.safeParse({ requestId: "r", project, parts: [part] }).success).toBe(true);
  });
});

describe("acceptQuoteSchema", () => {
  it("needs a PO number and the terms accepted", () => {
    expect(acceptQuoteSchema.safeParse({ quoteId: "q", poNumber: "KA-PO-7781", acceptTerms: true }).success).toBe(true);
    expect(acceptQuoteSchema.safeParse({ quoteId: "q", poNumber: "KA-PO-7781", acceptTerms: false }).success).toBe(false);
    expect(acceptQuoteSchema.safeParse({ quoteId: "q", poNumber: "  ", acceptTerms: true }).success).toBe(false);
    expect(acceptQuoteSchema.safeParse({ quoteId: "q", poNumber: "<script>", acceptTerms: true }).success).toBe(false);
  });
});

describe("billing and list query", () => {
  it("allows blank billing fields and checks the e-mail", () => {
    expect(billingSchema.safeParse({ billingContact: "", billingEmail: "", defaultPoNumber: "" }).success).toBe(true);
    expect(billingSchema.safeParse({ billingContact: "", billingEmail: "not-mail", defaultPoNumber: "" }).success).toBe(false);
  });
  it("defaults the sort and refuses unknown columns", () => {
    expect(listQuerySchema.parse({})).toMatchObject({ sort: "updatedAt", dir: "desc", limit: 50 });
    expect(listQuerySchema.safeParse({ sort: "password_hash" }).success).toBe(false);
  });
});
