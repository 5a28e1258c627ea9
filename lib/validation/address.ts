import { z } from "zod";

/**
 * Addresses the bureau ships to and bills. Countries by ISO 3166-1 alpha-2; where a country has
 * subdivisions the carrier needs (states, provinces), the ISO 3166-2 code is required and
 * checked; postal codes are checked against each country's published format (US ZIP and
 * ZIP+4, Canadian A1A 1A1, Mexican five digits: the postal services' formats, from memory).
 */
export const US_STATES = [
  "AL", "AK", "AZ", "AR", "CA", "CO", "CT", "DE", "DC", "FL", "GA", "HI", "ID", "IL", "IN", "IA", "KS", "KY", "LA", "ME", "MD", "MA", "MI", "MN", "MS",
  "MO", "MT", "NE", "NV", "NH", "NJ", "NM", "NY", "NC", "ND", "OH", "OK", "OR", "PA", "RI", "SC", "SD", "TN", "TX", "UT", "VT", "VA", "WA", "WV", "WI", "WY",
  "PR",
] as const;
export const CA_PROVINCES = ["AB", "BC", "MB", "NB", "NL", "NS", "NT", "NU", "ON", "PE", "QC", "SK", "YT"] as const;

interface CountryRule {
  name: string;
  regions?: readonly string[];
  regionLabel?: string;
  postal: RegExp;
  postalHint: string;
}

export const COUNTRIES: Record<string, CountryRule> = {
  US: { name: "United States", regions: US_STATES, regionLabel: "State", postal: /^\d{5}(-\d{4})?$/, postalHint: "five digits, or ZIP+4 (12345-6789)" },
  CA: { name: "Canada", regions: CA_PROVINCES, regionLabel: "Province or territory", postal: /^[A-Z]\d[A-Z] ?\d[A-Z]\d$/, postalHint: "A1A 1A1" },
  MX: { name: "Mexico", postal: /^\d{5}$/, postalHint: "five digits" },
  GB: { name: "United Kingdom", postal: /^[A-Z]{1,2}\d[A-Z\d]? ?\d[A-Z]{2}$/, postalHint: "e.g. AB1 2CD" },
  DE: { name: "Germany", postal: /^\d{5}$/, postalHint: "five digits" },
  FR: { name: "France", postal: /^\d{5}$/, postalHint: "five digits" },
  NL: { name: "Netherlands", postal: /^\d{4} ?[A-Z]{2}$/, postalHint: "1234 AB" },
  AU: { name: "Australia", postal: /^\d{4}$/, postalHint: "four digits" },
  JP: { name: "Japan", postal: /^\d{3}-?\d{4}$/, postalHint: "123-4567" },
};

const text = (max: number, what: string) => z.string().trim().min(1, `Enter the ${what}.`).max(max, `Use at most ${max} characters.`);
const optional = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters.`)
    .optional()
    .transform((v) => (v ? v : null));

export const addressSchema = z
  .object({
    label: text(60, "address's name (e.g. Main yard)"),
    attention: optional(80),
    line1: text(120, "street address"),
    line2: optional(120),
    city: text(80, "town or city"),
    region: z
      .string()
      .trim()
      .max(3)
      .optional()
      .transform((v) => (v ? v.toUpperCase() : null)),
    postalCode: z
      .string()
      .trim()
      .min(1, "Enter the postal code.")
      .max(12)
      .transform((v) => v.toUpperCase()),
    country: z
      .string()
      .trim()
      .transform((v) => v.toUpperCase())
      .refine((v) => v in COUNTRIES, "Pick a country from the list."),
    phone: optional(30).refine((v) => v === null || /^[+\d][\d ()./-]{5,29}$/.test(v), "Use digits, spaces and + ( ) - . / only."),
    deliveryNotes: optional(300),
  })
  .superRefine((a, ctx) => {
    const rule = COUNTRIES[a.country];
    if (!rule) return;
    if (rule.regions) {
      if (!a.region) ctx.addIssue({ code: "custom", path: ["region"], message: `Pick the ${rule.regionLabel?.toLowerCase() ?? "region"}.` });
      else if (!rule.regions.includes(a.region)) ctx.addIssue({ code: "custom", path: ["region"], message: `${a.region} is not a ${rule.regionLabel?.toLowerCase() ?? "region"} of ${rule.name}.` });
    }
    if (!rule.postal.test(a.postalCode)) ctx.addIssue({ code: "custom", path: ["postalCode"], message: `A postal code in ${rule.name} looks like ${rule.postalHint}.` });
  })
  .transform((a) => ({ ...a, region: COUNTRIES[a.country]?.regions ? a.region : null }));

export type AddressInput = z.input<typeof addressSchema>;
export type AddressValues = z.output<typeof addressSchema>;

/** An address as printed lines: attention, street, town, region and postal code, country. */
export function addressLines(a: { attention?: string | null; line1: string; line2?: string | null; city: string; region?: string | null; postalCode: string; country: string }): string[] {
  const town = [a.city, [a.region, a.postalCode].filter(Boolean).join(" ")].filter(Boolean).join(", ");
  return [a.attention ? `Attn: ${a.attention}` : null, a.line1, a.line2 ?? null, town, COUNTRIES[a.country]?.name ?? a.country].filter((x): x is string => Boolean(x));
}
