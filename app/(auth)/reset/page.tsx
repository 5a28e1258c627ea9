import type { Metadata } from "next";
import Link from "next/link";
import { ResetRequestForm } from "@/app/(auth)/reset/_components/reset-request-form";

export const metadata: Metadata = { title: "Reset your password" };

export default function ResetRequestPage() {
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Reset your password</h1>
      <p className="mb-6 mt-1 text-sm text-ink-500">Enter your account&apos;s e-mail; we send it a link to choose a new password.</p>
      <ResetRequestForm />
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="font-medium text-kiln-700 underline">
          Back to sign in
        </Link>
      </p>
    </>
  );
}
