import "server-only";
import { and, eq, gt, isNull, sql } from "drizzle-orm";
import type { Db } from "../client";
import { passwordResetTokens, signInAttempts, users } from "../schema";

/** Store a new reset token (its hash only); earlier unused tokens of the user stop working. */
export async function createPasswordResetToken(db: Db, input: { userId: string; tokenHash: string; expiresAt: Date; now: Date }) {
  await db.transaction(async (tx) => {
    await tx
      .update(passwordResetTokens)
      .set({ usedAt: input.now })
      .where(and(eq(passwordResetTokens.userId, input.userId), isNull(passwordResetTokens.usedAt)));
    await tx.insert(passwordResetTokens).values({ tokenHash: input.tokenHash, userId: input.userId, expiresAt: input.expiresAt, createdAt: input.now });
  });
}

/** Whether a token hash is unused and unexpired (read only: the page checks before showing the form). */
export async function isPasswordResetTokenLive(db: Db, tokenHash: string, now: Date): Promise<boolean> {
  const [row] = await db
    .select({ userId: passwordResetTokens.userId })
    .from(passwordResetTokens)
    .where(and(eq(passwordResetTokens.tokenHash, tokenHash), isNull(passwordResetTokens.usedAt), gt(passwordResetTokens.expiresAt, now)));
  return Boolean(row);
}

/**
 * Use a token once: the conditional update claims it (unused, unexpired) and the new hash is
 * written in the same transaction, so two concurrent uses cannot both succeed. Returns the
 * user's e-mail, or null when the token is unknown, used or expired.
 */
export async function consumePasswordResetToken(db: Db, input: { tokenHash: string; passwordHash: string; now: Date }): Promise<{ email: string } | null> {
  return db.transaction(async (tx) => {
    const [claimed] = await tx
      .update(passwordResetTokens)
      .set({ usedAt: input.now })
      .where(and(eq(passwordResetTokens.tokenHash, input.tokenHash), isNull(passwordResetTokens.usedAt), gt(passwordResetTokens.expiresAt, input.now)))
      .returning({ userId: passwordResetTokens.userId });
    if (!claimed) return null;
    const [user] = await tx
      .update(users)
      // Every session signed in before the reset ends with it.
      .set({ passwordHash: input.passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(eq(users.id, claimed.userId))
      .returning({ email: users.email });
    if (!user) return null;
    // A fresh password lifts a sign-in lock on that e-mail.
    await tx.delete(signInAttempts).where(eq(signInAttempts.key, `email:${user.email}`));
    return { email: user.email };
  });
}
