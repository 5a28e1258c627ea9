import "server-only";
import { and, count, eq, isNull, lt, or } from "drizzle-orm";
import type { Db } from "../client";
import { recoveryCodes, twoFactor, type TwoFactor } from "../schema";
import { writeAudit } from "./audit";

export async function getTwoFactor(db: Db, userId: string): Promise<TwoFactor | null> {
  const [row] = await db.select().from(twoFactor).where(eq(twoFactor.userId, userId));
  return row ?? null;
}

/** Is the user's second factor set up (confirmed)? */
export async function hasTwoFactor(db: Db, userId: string): Promise<boolean> {
  const row = await getTwoFactor(db, userId);
  return Boolean(row?.confirmedAt);
}

/** Begin (or begin again) an enrolment: a new secret, not yet confirmed. Refused when one is confirmed. */
export async function startEnrolment(db: Db, userId: string, secret: string): Promise<boolean> {
  const existing = await getTwoFactor(db, userId);
  if (existing?.confirmedAt) return false;
  await db
    .insert(twoFactor)
    .values({ userId, secret, confirmedAt: null, lastUsedStep: null })
    .onConflictDoUpdate({ target: twoFactor.userId, set: { secret, confirmedAt: null, lastUsedStep: null, createdAt: new Date() } });
  return true;
}

/**
 * Confirm an enrolment with the code's step and store the recovery codes' hashes, in one
 * transaction; audited. False when there was no unconfirmed enrolment (raced or already done).
 */
export async function confirmEnrolment(db: Db, input: { userId: string; step: number; recoveryHashes: string[]; now: Date }): Promise<boolean> {
  return db.transaction(async (tx) => {
    const done = await tx
      .update(twoFactor)
      .set({ confirmedAt: input.now, lastUsedStep: input.step })
      .where(and(eq(twoFactor.userId, input.userId), isNull(twoFactor.confirmedAt)))
      .returning({ userId: twoFactor.userId });
    if (done.length === 0) return false;
    await tx.delete(recoveryCodes).where(eq(recoveryCodes.userId, input.userId));
    await tx.insert(recoveryCodes).values(input.recoveryHashes.map((codeHash) => ({ userId: input.userId, codeHash })));
    await writeAudit(tx, { actorId: input.userId, action: "two_factor.enrolled", entityType: "user", entityId: input.userId });
    return true;
  });
}

/** Record that a code of `step` was used; false if that step (or a later one) was used already. */
export async function spendTotpStep(db: Db, userId: string, step: number): Promise<boolean> {
  const done = await db
    .update(twoFactor)
    .set({ lastUsedStep: step })
    .where(and(eq(twoFactor.userId, userId), or(isNull(twoFactor.lastUsedStep), lt(twoFactor.lastUsedStep, step))))
    .returning({ userId: twoFactor.userId });
  return done.length > 0;
}

/** Spend one recovery code (by its hash); false if unknown or already used. Audited. */
export async function spendRecoveryCode(db: Db, userId: string, codeHash: string, now: Date): Promise<boolean> {
  return db.transaction(async (tx) => {
    const done = await tx
      .update(recoveryCodes)
      .set({ usedAt: now })
      .where(and(eq(recoveryCodes.userId, userId), eq(recoveryCodes.codeHash, codeHash), isNull(recoveryCodes.usedAt)))
      .returning({ id: recoveryCodes.id });
    if (done.length === 0) return false;
    await writeAudit(tx, { actorId: userId, action: "two_factor.recovery_code_used", entityType: "user", entityId: userId });
    return true;
  });
}

export async function recoveryCodesLeft(db: Db, userId: string): Promise<number> {
  const [row] = await db.select({ n: count() }).from(recoveryCodes).where(and(eq(recoveryCodes.userId, userId), isNull(recoveryCodes.usedAt)));
  return row?.n ?? 0;
}

/** Replace the recovery codes (the old ones stop working). Audited. */
export async function replaceRecoveryCodes(db: Db, userId: string, recoveryHashes: string[]): Promise<void> {
  await db.transaction(async (tx) => {
    await tx.delete(recoveryCodes).where(eq(recoveryCodes.userId, userId));
    await tx.insert(recoveryCodes).values(recoveryHashes.map((codeHash) => ({ userId, codeHash })));
    await writeAudit(tx, { actorId: userId, action: "two_factor.recovery_codes_renewed", entityType: "user", entityId: userId });
  });
}

/** Remove a user's second factor and recovery codes (an admin's reset, or a client turning it off). Audited. */
export async function removeTwoFactor(db: Db, input: { userId: string; actorId: string; orgId?: string | null; reason: "reset_by_admin" | "turned_off" }): Promise<boolean> {
  return db.transaction(async (tx) => {
    const gone = await tx.delete(twoFactor).where(eq(twoFactor.userId, input.userId)).returning({ confirmedAt: twoFactor.confirmedAt });
    await tx.delete(recoveryCodes).where(eq(recoveryCodes.userId, input.userId));
    if (gone.length === 0) return false;
    await writeAudit(tx, {
      actorId: input.actorId,
      action: input.reason === "reset_by_admin" ? "two_factor.reset" : "two_factor.turned_off",
      entityType: "user",
      entityId: input.userId,
      orgId: input.orgId ?? null,
      before: { enrolled: Boolean(gone[0]?.confirmedAt) },
      after: { enrolled: false },
    });
    return true;
  });
}
