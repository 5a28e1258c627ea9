import type { Metadata } from "next";
import Link from "next/link";

export const metadata: Metadata = { title: "Check your e-mail" };

export default function ResetSentPage() {
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Check your e-mail</h1>
      <p className="mt-3 text-ink-600">
        If an account exists for that address, we have sent it a link to choose a new password. The link works once and expires in
        30 minutes.
      </p>
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="font-medium text-kiln-700 underline">
          Back to sign in
        </Link>
      </p>
    </>
  );
}
