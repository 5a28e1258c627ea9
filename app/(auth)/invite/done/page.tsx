import type { Metadata } from "next";
import Link from "next/link";

export const metadata: Metadata = { title: "Invitation accepted" };

export default function InvitationDonePage() {
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">You are on the staff</h1>
      <p className="mt-3 text-ink-600" role="status">
        Your name and password are set. Sign in with your e-mail address and the new password.
      </p>
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="font-medium text-kiln-700 underline">
          Sign in
        </Link>
      </p>
    </>
  );
}
