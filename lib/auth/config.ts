import { DrizzleAdapter } from "@auth/drizzle-adapter";
import NextAuth, { CredentialsSignin, type NextAuthConfig } from "next-auth";
import Credentials from "next-auth/providers/credentials";
import { createElement } from "react";
import { z } from "zod";
import { getDb } from "@/db/client";
import { clearThrottle, getThrottle, getUserForSignIn, saveThrottle } from "@/db/queries/auth";
import { accounts, sessions, users, verificationTokens } from "@/db/schema";
import MagicLinkEmail from "@/emails/magic-link";
import { sendEmail } from "@/lib/email/send";
import { verifyPassword } from "./password";
import { checkSecondFactor, needsCodeToSignIn } from "./second-factor";
import { ADDRESS_RULE, afterFailure, EMAIL_RULE, isLocked } from "./throttle";

class LockedSignin extends CredentialsSignin {
  code = "locked";
}
/** Password right; the account has a second factor and no code came with it. */
class CodeRequiredSignin extends CredentialsSignin {
  code = "code_required";
}
/** Password right; the code was wrong, already used, or not a code. */
class CodeInvalidSignin extends CredentialsSignin {
  code = "code_invalid";
}

const credentialsSchema = z.object({
  email: z.email().max(320),
  password: z.string().min(1).max(200),
  code: z.string().max(40).optional(),
});

function clientAddress(request: Request | undefined): string {
  const forwarded = request?.headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || request?.headers.get("x-real-ip") || "local";
}

/** Password check with per-e-mail and per-address throttling; says nothing of whether the e-mail exists. */
async function authorizeCredentials(raw: unknown, request: Request | undefined) {
  const parsed = credentialsSchema.safeParse(raw);
  if (!parsed.success) return null;
  const db = getDb();
  const email = parsed.data.email.toLowerCase();
  const now = new Date();
  const emailKey = `email:${email}`;
  const addressKey = `addr:${clientAddress(request)}`;
  const [emailState, addressState] = await Promise.all([getThrottle(db, emailKey), getThrottle(db, addressKey)]);
  if (isLocked(emailState, now) || isLocked(addressState, now)) throw new LockedSignin();

  const user = await getUserForSignIn(db, email);
  const ok = await verifyPassword(parsed.data.password, user?.passwordHash);
  if (!ok || !user || user.disabledAt) {
    await saveThrottle(db, emailKey, afterFailure(emailState, now, EMAIL_RULE));
    await saveThrottle(db, addressKey, afterFailure(addressState, now, ADDRESS_RULE));
    return null;
  }
  const secondFactor = await checkSecondFactor(db, user.id, parsed.data.code, now);
  if (secondFactor === "missing") throw new CodeRequiredSignin();
  if (secondFactor === "wrong") {
    // A wrong code counts like a wrong password, so six digits can not be guessed at leisure.
    await saveThrottle(db, emailKey, afterFailure(emailState, now, EMAIL_RULE));
    await saveThrottle(db, addressKey, afterFailure(addressState, now, ADDRESS_RULE));
    throw new CodeInvalidSignin();
  }
  await clearThrottle(db, emailKey);
  return { id: user.id, email: user.email, name: user.name };
}

export const authConfig = {
  adapter: DrizzleAdapter(getDb(), {
    usersTable: users,
    accountsTable: accounts,
    sessionsTable: sessions,
    verificationTokensTable: verificationTokens,
  }),
  // Credentials sign-in needs JWT sessions; the guard reloads the user from the database on
  // every request, so a changed role or a disabled account takes effect at once.
  session: { strategy: "jwt", maxAge: 8 * 60 * 60 },
  trustHost: true,
  pages: { signIn: "/sign-in", error: "/sign-in/problem", verifyRequest: "/sign-in/check-email" },
  providers: [
    Credentials({
      credentials: { email: { label: "E-mail" }, password: { label: "Password", type: "password" } },
      authorize: (credentials, request) => authorizeCredentials(credentials, request),
    }),
    {
      id: "email",
      type: "email",
      name: "E-mail link",
      from: process.env.EMAIL_FROM ?? "Ostrevane Additive Works <orders@ostrevane.example>",
      maxAge: 15 * 60,
      options: {},
      async sendVerificationRequest({ identifier, url }) {
        // Only existing accounts get a link; the page says the same either way.
        const user = await getUserForSignIn(getDb(), identifier);
        if (!user || user.disabledAt) return;
        // A link would skip the second factor: staff and clients who turned it on sign in with password and code.
        if (await needsCodeToSignIn(getDb(), user)) return;
        await sendEmail({
          to: identifier,
          subject: "Your Layerwright sign-in link",
          react: createElement(MagicLinkEmail, { url, minutes: 15 }),
          tags: [{ name: "template", value: "magic-link" }],
        });
      },
    },
  ],
  callbacks: {
    async signIn({ user, account, email }) {
      // Asking for a link always "succeeds" (the link is only sent to existing accounts), so the
      // page says the same for every address; using a link needs an existing, enabled account.
      if (email?.verificationRequest) return true;
      if (account?.provider === "email") {
        const existing = user.email ? await getUserForSignIn(getDb(), user.email) : null;
        return Boolean(existing && !existing.disabledAt && !(await needsCodeToSignIn(getDb(), existing)));
      }
      return true;
    },
    async jwt({ token, user }) {
      if (user?.id) token.sub = user.id;
      return token;
    },
    async session({ session, token }) {
      if (token.sub) session.user.id = token.sub;
      return session;
    },
  },
} satisfies NextAuthConfig;

export const { handlers, auth, signIn, signOut } = NextAuth(authConfig);
