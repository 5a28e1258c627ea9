import type { Metadata } from "next";
import Link from "next/link";
import { SignInForm } from "@/app/(auth)/sign-in/_components/sign-in-form";
import { safeCallbackPath } from "@/lib/validation/auth";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string }> }) {
  const { callbackUrl } = await searchParams;
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Sign in</h1>
      <p className="mb-6 mt-1 text-sm text-ink-500">
        New to Layerwright?{" "}
        <Link href="/sign-up" className="font-medium text-kiln-700 underline">
          Create a client account
        </Link>
      </p>
      <SignInForm callbackUrl={safeCallbackPath(callbackUrl) ?? undefined} />
    </>
  );
}
