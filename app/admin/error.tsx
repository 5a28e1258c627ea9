"use client";

import { ErrorPanel } from "@/components/layout/error-panel";

export default function AdminError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel digest={error.digest} reset={reset} homeHref="/admin" homeLabel="Back to the overview" who="whoever runs the system" />;
}
