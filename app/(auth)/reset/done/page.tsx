import type { Metadata } from "next";
import Link from "next/link";

export const metadata: Metadata = { title: "Password changed" };

export default function ResetDonePage() {
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Password changed</h1>
      <p className="mt-3 text-ink-600" role="status">
        Your new password is set. Sign in with it now.
      </p>
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="font-medium text-kiln-700 underline">
          Sign in
        </Link>
      </p>
    </>
  );
}
