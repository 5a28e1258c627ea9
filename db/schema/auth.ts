import { index, integer, primaryKey, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { createdAt, id, ROLES, ts } from "./common";

/** Users: Auth.js columns plus our own (role, password hash, preferences, clearance). */
export const users = sqliteTable(
  "users",
  {
    id: id(),
    name: text("name"),
    email: text("email").notNull(),
    emailVerified: ts("email_verified"),
    image: text("image"),
    passwordHash: text("password_hash"),
    role: text("role", { enum: ROLES }).notNull().default("client"),
    /** Cleared by the bureau to open files of requests flagged controlled (staff only). */
    isControlledCleared: integer("is_controlled_cleared", { mode: "boolean" }).notNull().default(false),
    unitsPref: text("units_pref", { enum: ["mm", "in"] }).notNull().default("mm"),
    disabledAt: ts("disabled_at"),
    /**
     * Sessions carry the version they were signed in at; the guard refuses a session whose
     * version is not the user's current one. Sign-out, a password reset, a role change and
     * removal add one, so every session of the user ends at once.
     */
    sessionVersion: integer("session_version").notNull().default(0),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("users_email_uq").on(t.email)],
);
export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;

export const accounts = sqliteTable(
  "accounts",
  {
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    type: text("type").notNull(),
    provider: text("provider").notNull(),
    providerAccountId: text("provider_account_id").notNull(),
    refresh_token: text("refresh_token"),
    access_token: text("access_token"),
    expires_at: integer("expires_at"),
    token_type: text("token_type"),
    scope: text("scope"),
    id_token: text("id_token"),
    session_state: text("session_state"),
  },
  (t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })],
);

export const sessions = sqliteTable("sessions", {
  sessionToken: text("session_token").primaryKey(),
  userId: text("user_id")
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  expires: ts("expires").notNull(),
});

export const verificationTokens = sqliteTable(
  "verification_tokens",
  {
    identifier: text("identifier").notNull(),
    token: text("token").notNull(),
    expires: ts("expires").notNull(),
  },
  (t) => [primaryKey({ columns: [t.identifier, t.token] })],
);

/** Failed sign-in counters per e-mail and per address, for slowing and locking. */
export const signInAttempts = sqliteTable("sign_in_attempts", {
  key: text("key").primaryKey(),
  failures: integer("failures").notNull().default(0),
  windowStartedAt: ts("window_started_at").notNull(),
  lockedUntil: ts("locked_until"),
});

/** Single-use, expiring password reset tokens (only the SHA-256 of the token is stored). */
export const passwordResetTokens = sqliteTable(
  "password_reset_tokens",
  {
    tokenHash: text("token_hash").primaryKey(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    expiresAt: ts("expires_at").notNull(),
    usedAt: ts("used_at"),
    createdAt: createdAt(),
  },
  (t) => [index("password_reset_user_idx").on(t.userId)],
);
