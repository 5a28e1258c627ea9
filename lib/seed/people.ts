/**
 * The demo's firms, their address books and one user per role (lib/seed/data.ts), as the sign-up
 * and invitation flows would have written them.
 */
import { hashPassword } from "@/lib/auth/password";
import { defaultRateCard } from "@/lib/estimating/defaults";
import { zoneFor } from "@/lib/estimating/freight";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { DEMO_PASSWORDS, DEMO_TOTP_SECRETS, DEMO_USERS, FIRM_ADDRESSES, FIRM_TERMS, FIRMS } from "./data";

const DAY = 86_400_000;

export interface SeededFirms {
  /** firm key → organisation id */
  orgIds: Map<string, string>;
  /** firm key → its default ship-to address */
  shipTos: Map<string, s.Address>;
}

export async function seedFirms(db: Db, now: Date): Promise<SeededFirms> {
  const orgIds = new Map<string, string>();
  for (const f of FIRMS) {
    const [row] = await db
      .insert(s.organisations)
      .values({
        name: f.name, slug: f.slug, unitsPref: f.unitsPref, billingContact: f.billingContact, billingEmail: `accounts@${f.key}.example`,
        ...(FIRM_TERMS[f.key] ? { paymentTerms: FIRM_TERMS[f.key]!.terms, creditLimitCents: FIRM_TERMS[f.key]!.limitCents, termsApprovedAt: new Date(now.getTime() - 120 * DAY) } : {}),
      })
      .returning({ id: s.organisations.id });
    orgIds.set(f.key, row!.id);
  }
  // Address book: billing, then shipping (the first one the default ship-to).
  const shipTos = new Map<string, s.Address>();
  for (const f of FIRMS) {
    const book = FIRM_ADDRESSES[f.key];
    const orgId = orgIds.get(f.key)!;
    const row = (a: (typeof book.shipping)[number], kind: "billing" | "shipping", isDefault: boolean) => ({
      orgId, kind, isDefault, label: a.label, attention: a.attention ?? null, line1: a.line1, line2: a.line2 ?? null, city: a.city, region: a.region,
      postalCode: a.postalCode, country: "US", phone: a.phone ?? null, deliveryNotes: a.deliveryNotes ?? null,
    });
    await db.insert(s.addresses).values(row(book.billing, "billing", true));
    const inserted = await db.insert(s.addresses).values(book.shipping.map((a, i) => row(a, "shipping", i === 0))).returning();
    shipTos.set(f.key, inserted[0]!);
  }
  return { orgIds, shipTos };
}

/** The freight zone of a firm's default ship-to, when the rate card has freight zones. */
export function zoneOfFirm(firms: SeededFirms, firm: string) {
  const a = firms.shipTos.get(firm);
  return a && defaultRateCard.freight ? zoneFor(defaultRateCard.freight, a.country, a.region) : null;
}

/** One user per demo account (e-mail → user id), staff with their second factor, clients in their firm. */
export async function seedUsers(db: Db, now: Date, orgIds: Map<string, string>): Promise<Map<string, string>> {
  const userIds = new Map<string, string>();
  const hashes = new Map<string, string>();
  for (const u of DEMO_USERS) {
    const password = DEMO_PASSWORDS[u.role];
    if (!hashes.has(password)) hashes.set(password, await hashPassword(password));
    const [row] = await db
      .insert(s.users)
      .values({
        email: u.email,
        name: u.name,
        role: u.role,
        passwordHash: hashes.get(password)!,
        isControlledCleared: Boolean(u.cleared),
        unitsPref: u.unitsPref ?? "mm",
        emailVerified: now,
      })
      .returning({ id: s.users.id });
    userIds.set(u.email, row!.id);
    const totpSecret = DEMO_TOTP_SECRETS[u.email];
    if (totpSecret) await db.insert(s.twoFactor).values({ userId: row!.id, secret: totpSecret, confirmedAt: now });
    if (u.firm) await db.insert(s.memberships).values({ orgId: orgIds.get(u.firm)!, userId: row!.id });
  }
  return userIds;
}
