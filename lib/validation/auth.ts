import { addressSchema } from "./address";
import { z } from "zod";

export const signInSchema = z.object({
  email: z.email("Enter a valid e-mail address.").max(320),
  password: z.string().min(1, "Enter your password.").max(200),
  /** Second step: six digits from the authenticator app, or a recovery code. Empty means none. */
  code: z
    .string()
    .trim()
    .max(40, "That is not a code.")
    .optional()
    .transform((v) => v || undefined),
  callbackUrl: z.string().max(500).optional(),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const magicLinkSchema = z.object({
  email: z.email("Enter a valid e-mail address.").max(320),
});

export const signUpSchema = z.object({
  name: z.string().trim().min(2, "Enter your name.").max(120),
  firmName: z.string().trim().min(2, "Enter your firm's name.").max(160),
  email: z.email("Enter a valid e-mail address.").max(320),
  password: z
    .string()
    .min(10, "Use at least 10 characters.")
    .max(200, "Use at most 200 characters.")
    .refine((p) => /[A-Za-z]/.test(p) && /[0-9]/.test(p), "Use letters and at least one digit."),
  unitsPref: z.enum(["mm", "in"]).default("mm"),
  /** The firm's billing address; with `shipHere` it is also the first ship-to. */
  address: addressSchema,
  shipHere: z
    .union([z.literal("on"), z.literal("true"), z.boolean()])
    .optional()
    .transform((v) => v === true || v === "on" || v === "true"),
});
export type SignUpInput = z.infer<typeof signUpSchema>;

const PROBE_ORIGIN = "http://layerwright.invalid";

/**
 * Only a path on this site may be a post-sign-in destination. Browsers drop tabs and line breaks
 * from a URL and read a backslash as a slash, so `/<tab>/host` or `/<backslash>host` would leave
 * the site: any control character, white space or backslash is refused, and what remains must
 * resolve to our own origin.
 * Returns the normalised path (with query and fragment), or null.
 */
export function safeCallbackPath(value: string | undefined | null): string | null {
  if (!value || value.length > 500 || !value.startsWith("/") || value.startsWith("//")) return null;
  if (/[\u0000-\u0020\u007f-\u00a0\u2028\u2029\\]/.test(value)) return null;
  let url: URL;
  try {
    url = new URL(value, PROBE_ORIGIN);
  } catch {
    return null;
  }
  if (url.origin !== PROBE_ORIGIN) return null;
  return url.pathname + url.search + url.hash;
}

/** A code typed to confirm the authenticator app (six digits; spaces allowed). */
export const twoFactorCodeSchema = z.object({
  code: z
    .string()
    .transform((v) => v.replace(/\s+/g, ""))
    .pipe(z.string().regex(/^\d{6}$/, "Enter the 6 digits the app shows.")),
});
