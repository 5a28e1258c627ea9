import Link from "next/link";

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-lg px-6 py-24 text-center">
      <p className="text-sm font-semibold text-kiln-700">403</p>
      <h1 className="mt-2 text-2xl font-semibold text-ink-900">Not part of your role</h1>
      <p className="mt-3 text-ink-600">Your account can not open this page. If you need it for your work, ask the bureau manager.</p>
      <Link href="/after-sign-in" className="mt-6 inline-block font-medium text-kiln-700 underline">
        Go to your home page
      </Link>
    </main>
  );
}
