"use client";

import Link from "next/link";
import { Button } from "@/components/ui/button";

/**
 * What a segment's error.tsx shows for an unexpected server or render error: plain words, a way
 * to try again, a way home, and the reference the server logged the error under (its digest), so
 * a user can quote it and staff can find the log line.
 */
export function ErrorPanel({ digest, reset, homeHref, homeLabel, who }: { digest?: string; reset: () => void; homeHref: string; homeLabel: string; who: string }) {
  return (
    <section role="alert" className="mx-auto max-w-xl rounded-lg border border-paper-300 bg-white px-6 py-10 text-center">
      <h1 className="text-xl font-semibold text-ink-900">This page could not be shown</h1>
      <p className="mt-3 text-ink-600">
        Something failed on our side. Nothing you had saved is lost. Try again; if it keeps happening, tell {who}
        {digest ? " and quote the reference below." : "."}
      </p>
      {digest ? (
        <p className="mt-3 text-sm text-ink-500">
          Reference: <code className="rounded bg-paper-100 px-1.5 py-0.5 font-mono text-ink-700">{digest}</code>
        </p>
      ) : null}
      <div className="mt-6 flex flex-wrap items-center justify-center gap-3">
        <Button onClick={reset}>Try again</Button>
        <Link href={homeHref} className="text-sm font-medium text-kiln-700 underline">
          {homeLabel}
        </Link>
      </div>
    </section>
  );
}
