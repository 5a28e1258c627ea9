import bcrypt from "bcryptjs";

/** bcrypt cost 10: about 60 ms a hash here (common practice for interactive sign-in). */
const COST = 10;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

/** A hash of a random string, compared against when no user matches, so timing says nothing. */
const DUMMY_HASH = "$2b$10$CwTycUXWue0Thq9StjUM0uJ8.a5Cz1r1o0ZjQ3oC9ug3QyN8m0nIW";

export async function verifyPassword(password: string, hash: string | null | undefined): Promise<boolean> {
  const ok = await bcrypt.compare(password, hash ?? DUMMY_HASH);
  return ok && Boolean(hash);
}
