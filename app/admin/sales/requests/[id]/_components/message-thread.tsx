"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { postStaffMessage } from "@/app/admin/sales/actions";
import { Button } from "@/components/ui/button";
import { FormMessage, Textarea } from "@/components/ui/input";
import { dateTimeText } from "@/components/admin/format";

export interface ThreadMessage {
  id: string;
  body: string;
  isFromStaff: boolean;
  createdAt: string;
  authorName: string | null;
}

export function MessageThread({ requestId, messages, isControlled = false }: { requestId: string; messages: ThreadMessage[]; isControlled?: boolean }) {
  const router = useRouter();
  const [body, setBody] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [pending, start] = useTransition();
  return (
    <div className="space-y-3">
      {messages.length === 0 ? <p className="text-sm text-ink-500">No messages on this request yet.</p> : null}
      <ol className="space-y-2">
        {messages.map((m) => (
          <li key={m.id} className={m.isFromStaff ? "ml-6 rounded bg-tide-50 p-3 text-sm" : "mr-6 rounded bg-paper-100 p-3 text-sm"}>
            <p className="text-xs text-ink-500">
              {m.authorName ?? "—"} · {m.isFromStaff ? "bureau" : "client"} · {dateTimeText(m.createdAt)}
            </p>
            <p className="mt-1 whitespace-pre-wrap text-ink-800">{m.body}</p>
          </li>
        ))}
      </ol>
      <form
        className="space-y-2"
        onSubmit={(e) => {
          e.preventDefault();
          start(async () => {
            const r = await postStaffMessage({ requestId, body });
            if (!r.ok) return setError(r.message);
            setBody("");
            setError(null);
            router.refresh();
          });
        }}
      >
        <label htmlFor="staff-message" className="sr-only">
          Message to the client
        </label>
        <Textarea id="staff-message" placeholder="Write to the client…" value={body} onChange={(e) => setBody(e.target.value)} />
        <p className="text-xs text-ink-500">
          {isControlled
            ? "The client is e-mailed that there is a new message, with a link; the text stays out of e-mail (controlled request)."
            : "The client is e-mailed a copy with a link back to the request."}
        </p>
        <FormMessage>{error}</FormMessage>
        <Button type="submit" variant="secondary" disabled={pending || !body.trim()}>
          Send message
        </Button>
      </form>
    </div>
  );
}
