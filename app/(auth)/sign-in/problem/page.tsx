import { redirect } from "next/navigation";
import { AuthNotice } from "@/components/auth/auth-notice";

/** Our reasons, as they appear in the address bar, and what each tells the person. */
const MESSAGES = {
  "link-used": "This sign-in link has expired or has already been used. Ask for a new one.",
  "no-link": "That account cannot sign in with a link. Use your password, or ask your firm's lead for an invitation.",
  unavailable: "Sign-in is not available right now. Please try again in a few minutes.",
  failed: "Signing in did not work. Please try again.",
} as const;
type Reason = keyof typeof MESSAGES;

/** The sign-in library sends its own error codes here (`?error=…`); they become our reasons. */
const FROM_LIBRARY: Record<string, Reason> = { Verification: "link-used", AccessDenied: "no-link", Configuration: "unavailable" };

export default async function SignInProblemPage({ searchParams }: { searchParams: Promise<{ error?: string; reason?: string }> }) {
  const { error, reason } = await searchParams;
  if (error !== undefined) redirect(`/sign-in/problem?reason=${FROM_LIBRARY[error] ?? "failed"}`);
  const message = reason && reason in MESSAGES ? MESSAGES[reason as Reason] : MESSAGES.failed;
  return (
    <AuthNotice title="We could not sign you in" role="alert">
      {message}
    </AuthNotice>
  );
}
