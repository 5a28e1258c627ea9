import { Alert } from "@/components/ui/alert";
import type { listUndeliveredEmails } from "@/db/queries/email-jobs";
import { ResendButton } from "./resend-button";

type Row = Awaited<ReturnType<typeof listUndeliveredEmails>>[number];
const when = (d: Date | null) => (d ? `${d.toISOString().slice(0, 16).replace("T", " ")} UTC` : "—");

/** E-mails the e-mail service has not taken yet: failed ones to send again, and those waiting for their next attempt. */
export function UndeliveredEmails({ rows }: { rows: Row[] }) {
  if (rows.length === 0) return null;
  return (
    <section aria-labelledby="undelivered-title" className="mb-8 space-y-3">
      <h2 id="undelivered-title" className="font-semibold text-ink-800">
        Not delivered yet
      </h2>
      <Alert tone="info" title="The e-mail service did not take these">
        Each is tried again with growing waits (1, 2, 4 … minutes, for about four hours). After that, or when the service refuses an e-mail outright, it shows as failed here until you send it again.
      </Alert>
      <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto rounded-md bg-white ring-1 ring-paper-200">
        <table className="min-w-full text-sm">
          <thead className="bg-paper-100 text-left text-xs uppercase tracking-wide text-ink-500">
            <tr>
              <th className="px-4 py-2">Queued</th>
              <th className="px-4 py-2">To</th>
              <th className="px-4 py-2">Subject</th>
              <th className="px-4 py-2">State</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-paper-200">
            {rows.map((m) => (
              <tr key={m.id}>
                <td className="whitespace-nowrap px-4 py-2 figures text-ink-500">{when(m.createdAt)}</td>
                <td className="px-4 py-2">{m.toAddresses.join(", ")}</td>
                <td className="px-4 py-2">{m.subject}</td>
                <td className="px-4 py-2">
                  {m.status === "failed" ? (
                    <span className="space-y-1">
                      <span className="block text-signal-danger">Failed after {m.attempts} attempts{m.lastError ? `: ${m.lastError}` : ""}</span>
                      <ResendButton jobId={m.id} />
                    </span>
                  ) : (
                    <span className="text-ink-600">
                      {m.attempts} attempt{m.attempts === 1 ? "" : "s"} so far; next {when(m.nextAttemptAt)}
                    </span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
