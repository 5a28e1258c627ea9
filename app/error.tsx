"use client";

export default function ErrorPage({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-6 py-24 text-center">
      <h1 className="text-2xl font-semibold text-ink-900">Something went wrong on our side</h1>
      <p className="mt-3 text-ink-600">Nothing you entered was lost. Try again; if it keeps happening, tell the bureau.</p>
      <button onClick={reset} className="mt-6 rounded bg-kiln-600 px-4 py-2 text-sm font-medium text-white">
        Try again
      </button>
    </main>
  );
}
