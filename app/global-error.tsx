"use client";

import "./globals.css";

/**
 * Replaces the root layout when the layout itself fails, so it brings its own <html> and <body>
 * and no shared components (they may be what failed).
 */
export default function GlobalError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en">
      <body className="min-h-screen bg-paper-50 font-sans">
        <main className="mx-auto max-w-lg px-6 py-24 text-center">
          <h1 className="text-2xl font-semibold text-ink-900">Layerwright is having trouble</h1>
          <p className="mt-3 text-ink-600">Something failed on our side. Nothing you had saved is lost. Try again in a moment.</p>
          {error.digest ? (
            <p className="mt-3 text-sm text-ink-500">
              Reference: <code className="font-mono">{error.digest}</code>
            </p>
          ) : null}
          <button onClick={reset} className="mt-6 rounded bg-kiln-600 px-4 py-2 text-sm font-medium text-white">
            Try again
          </button>
        </main>
      </body>
    </html>
  );
}
