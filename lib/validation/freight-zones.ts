import { z } from "zod";

const cents = (what: string) => z.number({ error: `Enter the ${what}.` }).int("Whole cents.").min(0, "Not below zero.").max(100_000_000, "Too large.");

const region = z
  .string()
  .trim()
  .transform((v) => v.toUpperCase())
  .refine((v) => v === "*" || /^[A-Z]{2}(-[A-Z0-9]{1,3})?$/.test(v), "Use country codes (CA), subdivisions (US-TX) or * for everywhere else.");

export const freightZoneSchema = z.object({
  key: z.string().trim().regex(/^[a-z0-9-]{1,40}$/, "Lower-case letters, digits and dashes."),
  name: z.string().trim().min(1, "Name the zone.").max(80),
  regions: z.array(region).min(1, "List at least one region."),
  baseCents: cents("base price"),
  centsPerKg: cents("rate per kg"),
  flatbedSurchargeCents: cents("flatbed surcharge"),
  transitDays: z.number().int("Whole days.").min(0).max(120),
});

/** The rate card's freight table as the admin form sends it (money already in cents). */
export const freightRulesSchema = z
  .object({
    zones: z.array(freightZoneSchema).min(1, "Keep at least one zone.").max(40),
    defaultZoneKey: z.string().min(1),
    dimKgPerM3: z.number().min(0).max(2000),
    crateTareKgPerM3: z.number().min(0).max(1000),
    closedTrailer: z.object({ lengthMm: z.number().positive(), widthMm: z.number().positive(), heightMm: z.number().positive(), maxKg: z.number().positive() }),
  })
  .superRefine((r, ctx) => {
    const keys = r.zones.map((z) => z.key);
    keys.forEach((k, i) => {
      if (keys.indexOf(k) !== i) ctx.addIssue({ code: "custom", path: ["zones", i, "key"], message: `Zone key ${k} is used twice.` });
    });
    if (!keys.includes(r.defaultZoneKey)) ctx.addIssue({ code: "custom", path: ["defaultZoneKey"], message: "The default zone must be one of the zones." });
    const seen = new Map<string, string>();
    r.zones.forEach((z, i) =>
      z.regions.forEach((code) => {
        const other = seen.get(code);
        if (other) ctx.addIssue({ code: "custom", path: ["zones", i, "regions"], message: `${code} is already in ${other}.` });
        else seen.set(code, z.name);
      }),
    );
  });
