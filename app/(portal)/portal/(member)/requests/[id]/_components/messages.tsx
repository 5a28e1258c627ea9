"use client";

import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { postMessage } from "@/app/(portal)/portal/(member)/requests/[id]/actions";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { FormMessage, Textarea } from "@/components/ui/input";
import { ATTACHMENT_LIMIT, useUploadThing } from "@/components/portal/uploadthing";
import { formatDateTime } from "@/lib/dates";

export interface MessageView {
  id: string;
  parentId: string | null;
  body: string;
  isFromStaff: boolean;
  createdAt: string;
  authorName: string | null;
  attachments: { id: string; title: string; sizeBytes: number | null }[];
}

const when = (iso: string) => formatDateTime(iso);

function Composer({ requestId, parentId, onDone, label }: { requestId: string; parentId?: string; onDone: () => void; label: string }) {
  const [body, setBody] = useState("");
  const [files, setFiles] = useState<File[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [progress, setProgress] = useState<number | null>(null);
  const input = useRef<HTMLInputElement>(null);
  const { startUpload } = useUploadThing("attachment", { onUploadProgress: setProgress });
  async function send(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    if (!body.trim()) return setError("Write a message.");
    const big = files.find((f) => f.size > ATTACHMENT_LIMIT.bytes);
    if (big) return setError(`“${big.name}” is over the ${ATTACHMENT_LIMIT.label} limit.`);
    setBusy(true);
    try {
      let uploadIds: string[] = [];
      if (files.length) {
        const res = await startUpload(files);
        uploadIds = (res ?? []).map((r) => (r.serverData).uploadId);
      }
      const res = await postMessage({ requestId, parentId, body, uploadIds });
      if (!res.ok) return setError(res.message);
      setBody("");
      setFiles([]);
      onDone();
    } catch (err) {
      setError(`The attachment could not be uploaded: ${(err as Error).message}. Your message is still here.`);
    } finally {
      setBusy(false);
      setProgress(null);
    }
  }
  return (
    <form onSubmit={send} className="space-y-2" aria-label={label}>
      <Textarea value={body} onChange={(e) => setBody(e.target.value)} rows={3} aria-label={label} placeholder="Write to the bureau…" />
      <div className="flex flex-wrap items-center gap-2">
        <input ref={input} type="file" multiple className="sr-only" aria-label="Attach files to the message" onChange={(e) => setFiles(Array.from(e.target.files ?? []).slice(0, 4))} />
        <Button type="button" variant="ghost" size="sm" onClick={() => input.current?.click()}>
          Attach files
        </Button>
        <span className="text-xs text-ink-500">{files.length ? files.map((f) => f.name).join(", ") : `up to 4 files, ${ATTACHMENT_LIMIT.label} each`}</span>
        <Button type="submit" size="sm" className="ml-auto" disabled={busy}>
          {busy ? (progress !== null ? `Uploading ${Math.round(progress)} %` : "Sending…") : "Send"}
        </Button>
      </div>
      <FormMessage>{error}</FormMessage>
    </form>
  );
}

/** Messages with the bureau, threaded by reply. */
export function MessagesThread({ requestId, messages }: { requestId: string; messages: MessageView[] }) {
  const router = useRouter();
  const [replyTo, setReplyTo] = useState<string | null>(null);
  const roots = messages.filter((m) => !m.parentId || !messages.some((x) => x.id === m.parentId));
  const replies = (id: string) => messages.filter((m) => m.parentId === id);
  const Item = ({ m, depth }: { m: MessageView; depth: number }) => (
    <li className={depth ? "ml-4 border-l-2 border-paper-200 pl-3 sm:ml-8" : ""}>
      <div className={`rounded px-3 py-2 ${m.isFromStaff ? "bg-tide-50" : "bg-paper-50"}`}>
        <p className="text-xs text-ink-500">
          <span className="font-medium text-ink-700">{m.authorName ?? "Someone"}</span> {m.isFromStaff ? <Badge tone="info">Bureau</Badge> : null} · {when(m.createdAt)}
        </p>
        <p className="mt-1 whitespace-pre-wrap text-sm text-ink-800">{m.body}</p>
        {m.attachments.length ? (
          <ul className="mt-1 flex flex-wrap gap-2 text-xs">
            {m.attachments.map((a) => (
              <li key={a.id}>
                <a href={`/api/files/${a.id}`} className="text-kiln-700 underline">
                  {a.title}
                </a>
              </li>
            ))}
          </ul>
        ) : null}
        <button type="button" className="mt-1 text-xs text-kiln-700 hover:underline" onClick={() => setReplyTo(replyTo === m.id ? null : m.id)}>
          {replyTo === m.id ? "Cancel reply" : "Reply"}
        </button>
      </div>
      {replyTo === m.id ? (
        <div className="mt-2">
          <Composer requestId={requestId} parentId={m.id} label="Your reply" onDone={() => { setReplyTo(null); router.refresh(); }} />
        </div>
      ) : null}
      {replies(m.id).length ? (
        <ul className="mt-2 space-y-2">
          {replies(m.id).map((r) => (
            <Item key={r.id} m={r} depth={depth + 1} />
          ))}
        </ul>
      ) : null}
    </li>
  );
  return (
    <div className="space-y-4">
      {roots.length === 0 ? <p className="text-sm text-ink-500">No messages yet. Questions about the file, the material or the dates go here.</p> : null}
      <ul className="space-y-3">
        {roots.map((m) => (
          <Item key={m.id} m={m} depth={0} />
        ))}
      </ul>
      <Composer requestId={requestId} label="New message" onDone={() => router.refresh()} />
    </div>
  );
}
