"use client";

import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { resendEmail } from "../actions";

export function ResendButton({ jobId }: { jobId: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const [pending, start] = useTransition();
  return (
    <span className="flex flex-wrap items-center gap-2">
      <Button
        size="sm"
        variant="secondary"
        disabled={pending}
        onClick={() =>
          start(async () => {
            const r = await resendEmail({ jobId });
            setMessage(r.ok ? (r.data.sent ? "Sent." : "Not sent yet; it will be tried again.") : r.message);
          })
        }
      >
        {pending ? "Sending…" : "Send again"}
      </Button>
      {message ? <span className="text-xs text-ink-600" role="status">{message}</span> : null}
    </span>
  );
}
