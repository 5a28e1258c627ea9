"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { retryFailedAnalysis } from "@/app/admin/sales/actions";
import { Button } from "@/components/ui/button";

/** Runs a failed analysis again (attempts start from zero); the page refreshes to show progress. */
export function RetryAnalysisButton({ analysisId }: { analysisId: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [pending, start] = useTransition();
  return (
    <span className="mt-2 flex flex-wrap items-center gap-2">
      <Button
        size="sm"
        variant="secondary"
        disabled={pending}
        onClick={() =>
          start(async () => {
            const r = await retryFailedAnalysis({ analysisId });
            setMessage(r.ok ? "Running again; reload in a minute to see the estimate." : r.message);
            router.refresh();
          })
        }
      >
        {pending ? "Starting…" : "Run the analysis again"}
      </Button>
      {message ? <span className="text-sm text-ink-600" role="status">{message}</span> : null}
    </span>
  );
}
