import Link from "next/link";

const MESSAGES: Record<string, string> = {
  Verification: "This sign-in link has expired or has already been used. Ask for a new one.",
  AccessDenied: "That account cannot sign in with a link. Use your password, or ask your firm's lead for an invitation.",
  Configuration: "Sign-in is not available right now. Please try again in a few minutes.",
};

export default async function SignInProblemPage({ searchParams }: { searchParams: Promise<{ error?: string }> }) {
  const { error } = await searchParams;
  const message = (error && MESSAGES[error]) ?? "Signing in did not work. Please try again.";
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">We could not sign you in</h1>
      <p className="mt-3 text-ink-600" role="alert">
        {message}
      </p>
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="font-medium text-kiln-700 underline">
          Back to sign in
        </Link>
      </p>
    </>
  );
}
