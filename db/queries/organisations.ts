import "server-only";
import { eq } from "drizzle-orm";
import type { Db } from "../client";
import { memberships, organisations, users } from "../schema";
import type { AddressValues } from "../../lib/validation/address";
import { createAddress } from "./addresses";

export async function isEmailTaken(db: Db, email: string): Promise<boolean> {
  const [row] = await db.select({ id: users.id }).from(users).where(eq(users.email, email.toLowerCase()));
  return Boolean(row);
}

export function slugify(name: string): string {
  return name
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-|-$/g, "")
    .slice(0, 60) || "firm";
}

/** Sign-up: a new client firm whose first user is its client_admin, in one transaction. */
export async function createClientFirmWithAdmin(
  db: Db,
  input: { name: string; firmName: string; email: string; passwordHash: string; unitsPref: "mm" | "in"; address?: AddressValues; shipHere?: boolean },
) {
  return db.transaction(async (tx) => {
    const base = slugify(input.firmName);
    const taken = await tx.select({ slug: organisations.slug }).from(organisations).where(eq(organisations.slug, base));
    const slug = taken.length ? `${base}-${Math.random().toString(36).slice(2, 7)}` : base;
    const [org] = await tx
      .insert(organisations)
      .values({ name: input.firmName, slug, billingEmail: input.email, unitsPref: input.unitsPref })
      .returning({ id: organisations.id });
    const [user] = await tx
      .insert(users)
      .values({ name: input.name, email: input.email, passwordHash: input.passwordHash, role: "client_admin", unitsPref: input.unitsPref })
      .returning({ id: users.id });
    await tx.insert(memberships).values({ orgId: org!.id, userId: user!.id });
    if (input.address) {
      await createAddress(tx, { orgId: org!.id, kind: "billing", values: input.address, actorId: user!.id });
      if (input.shipHere) await createAddress(tx, { orgId: org!.id, kind: "shipping", values: input.address, actorId: user!.id });
    }
    return { orgId: org!.id, userId: user!.id };
  });
}

export async function getOrganisation(db: Db, orgId: string) {
  const [row] = await db.select().from(organisations).where(eq(organisations.id, orgId));
  return row ?? null;
}
