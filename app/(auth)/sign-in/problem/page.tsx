import { AuthNotice } from "@/components/auth/auth-notice";

const MESSAGES: Record<string, string> = {
  Verification: "This sign-in link has expired or has already been used. Ask for a new one.",
  AccessDenied: "That account cannot sign in with a link. Use your password, or ask your firm's lead for an invitation.",
  Configuration: "Sign-in is not available right now. Please try again in a few minutes.",
};

export default async function SignInProblemPage({ searchParams }: { searchParams: Promise<{ error?: string }> }) {
  const { error } = await searchParams;
  const message = (error && MESSAGES[error]) ?? "Signing in did not work. Please try again.";
  return (
    <AuthNotice title="We could not sign you in" role="alert">
      {message}
    </AuthNotice>
  );
}
