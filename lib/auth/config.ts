import "server-only";
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import NextAuth, { CredentialsSignin, type NextAuthConfig } from "next-auth";
import Credentials from "next-auth/providers/credentials";
import { createElement } from "react";
import { getDb } from "@/db/client";
import { countAttempt, getSessionVersion, getUserForSignIn } from "@/db/queries/auth";
import { accounts, sessions, users, verificationTokens } from "@/db/schema";
import MagicLinkEmail from "@/emails/magic-link";
import { sendEmail } from "@/lib/email/send";
import { env } from "@/lib/env";
import { clientAddress } from "./client-address";
import { needsCodeToSignIn } from "./second-factor";
import { checkPasswordSignIn } from "./sign-in";
import { endSessionsOnSignOut } from "./sign-out";
import { isOverLimit, LINK_EMAIL_RULE } from "./throttle";

class LockedSignin extends CredentialsSignin {
  override code = "locked";
}
/** Password right; the account has a second factor and no code came with it. */
class CodeRequiredSignin extends CredentialsSignin {
  override code = "code_required";
}
/** Password right; the code was wrong, already used, or not a code. */
class CodeInvalidSignin extends CredentialsSignin {
  override code = "code_invalid";
}

async function authorizeCredentials(raw: unknown, request: Request | undefined) {
  const result = await checkPasswordSignIn(getDb(), raw, clientAddress(request?.headers), new Date());
  if (result.kind === "locked") throw new LockedSignin();
  if (result.kind === "code_required") throw new CodeRequiredSignin();
  if (result.kind === "code_invalid") throw new CodeInvalidSignin();
  return result.kind === "ok" ? result.user : null;
}

export const authConfig = {
  adapter: DrizzleAdapter(getDb(), {
    usersTable: users,
    accountsTable: accounts,
    sessionsTable: sessions,
    verificationTokensTable: verificationTokens,
  }),
  // Credentials sign-in needs JWT sessions. Each token carries the user's session version at
  // sign-in (`sv`); the guard reloads the user on every request and refuses a token whose version
  // is no longer the user's, so sign-out, a reset, a role change or a removal end it everywhere.
  session: { strategy: "jwt", maxAge: 8 * 60 * 60 },
  secret: env().AUTH_SECRET,
  // Whether to trust the Host header is the deployment's choice (AUTH_TRUST_HOST); links are
  // built from AUTH_URL, which instrumentation.ts sets from APP_URL.
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
      from: env().EMAIL_FROM,
      maxAge: 15 * 60,
      options: {},
      async sendVerificationRequest({ identifier, url }) {
        const db = getDb();
        // The page says the same whatever happens here: only existing accounts get a link, and
        // an address asked for too often in a quarter hour gets no more mail.
        const count = await countAttempt(db, `link:email:${identifier.toLowerCase()}`, LINK_EMAIL_RULE, new Date());
        if (isOverLimit(count, LINK_EMAIL_RULE)) return;
        const user = await getUserForSignIn(db, identifier);
        if (!user || user.disabledAt) return;
        // A link would skip the second factor: staff and clients who turned it on sign in with password and code.
        if (await needsCodeToSignIn(db, user)) return;
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
      if (user?.id) {
        token.sub = user.id;
        token.sv = (await getSessionVersion(getDb(), user.id)) ?? 0;
      }
      return token;
    },
    async session({ session, token }) {
      if (token.sub) session.user.id = token.sub;
      session.sessionVersion = typeof token.sv === "number" ? token.sv : -1;
      return session;
    },
  },
  events: { signOut: endSessionsOnSignOut },
} satisfies NextAuthConfig;

export const { handlers, auth, signIn, signOut } = NextAuth(authConfig);
