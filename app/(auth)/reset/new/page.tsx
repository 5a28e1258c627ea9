import type { Metadata } from "next";
import Link from "next/link";
import { getDb } from "@/db/client";
import { isPasswordResetTokenLive } from "@/db/queries/password-reset";
import { ResetPasswordForm } from "@/app/(auth)/reset/new/_components/reset-password-form";
import { hashResetToken } from "@/lib/auth/password-reset";

export const metadata: Metadata = { title: "Choose a new password", referrer: "no-referrer" };

export default async function NewPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string | string[] }> }) {
  const { token } = await searchParams;
  const value = typeof token === "string" && /^[A-Za-z0-9_-]{43}$/.test(token) ? token : null;
  const live = value ? await isPasswordResetTokenLive(getDb(), hashResetToken(value), new Date()) : false;
  if (!value || !live) {
    return (
      <>
        <h1 className="text-2xl font-semibold text-ink-900">This link no longer works</h1>
        <p className="mt-3 text-ink-600" role="alert">
          This reset link has expired or has already been used. Ask for a new one.
        </p>
        <p className="mt-6 text-sm">
          <Link href="/reset" className="font-medium text-kiln-700 underline">
            Ask for a new reset link
          </Link>
        </p>
      </>
    );
  }
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Choose a new password</h1>
      <p className="mb-6 mt-1 text-sm text-ink-500">The link works once. After saving, sign in with the new password.</p>
      <ResetPasswordForm token={value} />
    </>
  );
}
