/**
 * Shared set-up of the back-office integration tests: a seeded throwaway database, the session
 * the guard sees (Auth.js's `auth()` mocked to return a seeded user), and lookups by e-mail.
 * Each test file calls vi.mock itself (vi.mock is hoisted per file) with the refs made here.
 */
import { eq } from "drizzle-orm";
import type { Db } from "../../db/client";
import { DEMO_USERS } from "@/lib/seed/data";
import { users } from "../../db/schema";
import type { Role } from "../../db/schema/common";

export const STAFF_EMAIL: Record<Exclude<Role, "client" | "client_admin">, string> = {
  admin: "admin@ostrevane.example",
  sales: "sales@ostrevane.example",
  production: "production@ostrevane.example",
  accounts: "accounts@ostrevane.example",
};

/** One demo user per role (the first of each). */
export const USER_BY_ROLE: Record<Role, string> = Object.fromEntries(
  (["client", "client_admin", "sales", "production", "accounts", "admin"] as const).map((r) => [r, DEMO_USERS.find((u) => u.role === r)!.email]),
) as Record<Role, string>;

export async function userIdOf(db: Db, email: string): Promise<string> {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  if (!u) throw new Error(`no seeded user ${email}`);
  return u.id;
}

/** What a thrown page interrupt means. */
export function interruptOf(e: unknown): "forbidden" | "redirect" | "not_found" | null {
  const digest = (e as { digest?: string } | null)?.digest ?? "";
  if (digest.endsWith(";403")) return "forbidden";
  if (digest.endsWith(";404")) return "not_found";
  if (digest.startsWith("NEXT_REDIRECT")) return "redirect";
  return null;
}
