import { index, integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { createdAt, id, ts } from "./common";

/**
 * A user's authenticator app (time-based one-time codes, RFC 6238). The row exists from the
 * moment enrolment starts; it counts only once `confirmedAt` is set (the user typed a code from
 * the app). The shared secret must be readable to check codes, so it is stored as is: the
 * database file and its backups are as sensitive as the passwords' hashes and more.
 */
export const twoFactor = sqliteTable("two_factor", {
  userId: text("user_id")
    .primaryKey()
    .references(() => users.id, { onDelete: "cascade" }),
  secret: text("secret").notNull(),
  confirmedAt: ts("confirmed_at"),
  /** The last time step (30 s) a code was accepted for, so one code signs in once. */
  lastUsedStep: integer("last_used_step"),
  createdAt: createdAt(),
});
export type TwoFactor = typeof twoFactor.$inferSelect;

/** One-use recovery codes for a lost phone; only their SHA-256 is stored. */
export const recoveryCodes = sqliteTable(
  "recovery_codes",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    codeHash: text("code_hash").notNull(),
    usedAt: ts("used_at"),
    createdAt: createdAt(),
  },
  (t) => [index("recovery_codes_user_idx").on(t.userId)],
);
