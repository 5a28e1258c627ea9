"use client";

import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/input";
import { deleteOrderFilesNow } from "../actions";

/** Two steps: ask, then confirm; the server checks role, firm and stage again. */
export function DeleteFilesButton({ requestId }: { requestId: string }) {
  const [asking, setAsking] = useState(false);
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, start] = useTransition();
  if (!asking) {
    return (
      <Button variant="secondary" size="sm" onClick={() => setAsking(true)}>
        Delete these files now
      </Button>
    );
  }
  return (
    <div className="space-y-2 rounded border border-paper-300 p-3">
      <p className="text-sm text-ink-700">This deletes every model file of this order from the bureau&apos;s storage. It cannot be undone; a re-order needs the files again.</p>
      <div className="flex flex-wrap gap-2">
        <Button
          variant="danger"
          size="sm"
          disabled={pending}
          onClick={() =>
            start(async () => {
              const r = await deleteOrderFilesNow({ requestId, confirm: "delete" });
              setMsg(r.ok ? { tone: "ok", text: r.data.deletedCount === null ? "Asked for: the files go at the next daily run." : "The files are deleted." } : { tone: "error", text: r.message });
            })
          }
        >
          {pending ? "Deleting…" : "Yes, delete the files"}
        </Button>
        <Button variant="ghost" size="sm" disabled={pending} onClick={() => setAsking(false)}>
          Keep them
        </Button>
      </div>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
    </div>
  );
}
