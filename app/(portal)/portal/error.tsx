"use client";

import { ErrorPanel } from "@/components/layout/error-panel";

export default function PortalError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel digest={error.digest} reset={reset} homeHref="/portal" homeLabel="Back to your requests and orders" who="the bureau" />;
}
