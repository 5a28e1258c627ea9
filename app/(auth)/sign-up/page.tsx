import type { Metadata } from "next";
import Link from "next/link";
import { SignUpForm } from "@/app/(auth)/sign-up/_components/sign-up-form";

export const metadata: Metadata = { title: "Create an account" };

export default function SignUpPage() {
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Create a client account</h1>
      <p className="mb-6 mt-1 text-sm text-ink-500">
        Already have one?{" "}
        <Link href="/sign-in" className="font-medium text-kiln-700 underline">
          Sign in
        </Link>
      </p>
      <SignUpForm />
    </>
  );
}
