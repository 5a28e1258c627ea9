import type { Metadata } from "next";
import Link from "next/link";
import { getDb } from "@/db/client";
import { listUndeliveredEmails } from "@/db/queries/email-jobs";
import { listOutboxMessages } from "@/db/queries/outbox";
import { EmptyState, PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";
import { UndeliveredEmails } from "./_components/undelivered";
import { formatDateTime } from "@/lib/dates";

export const metadata: Metadata = { title: "Outbox" };
export const dynamic = "force-dynamic";

export default async function OutboxPage() {
  await pagePermission("admin:outbox", "/admin/outbox");
  const db = getDb();
  const [rows, undelivered] = await Promise.all([listOutboxMessages(db, 200), listUndeliveredEmails(db)]);
  return (
    <>
      <PageHeader title="Outbox" subtitle="Every e-mail accepted by the e-mail service, newest first." />
      <UndeliveredEmails rows={undelivered} />
      {rows.length === 0 ? (
        <EmptyState title="No e-mail sent yet">Sign-in links, quotes and order news will appear here as they go out.</EmptyState>
      ) : (
        <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto rounded-md bg-white ring-1 ring-paper-200">
          <table className="min-w-full text-sm">
            <thead className="bg-paper-100 text-left text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="px-4 py-2">Sent</th>
                <th className="px-4 py-2">To</th>
                <th className="px-4 py-2">Subject</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-200">
              {rows.map((m) => (
                <tr key={m.id} className="hover:bg-paper-50">
                  <td className="whitespace-nowrap px-4 py-2 figures text-ink-500">{formatDateTime(m.createdAt)}</td>
                  <td className="px-4 py-2">{m.toAddresses.join(", ")}</td>
                  <td className="px-4 py-2">
                    <Link href={`/admin/outbox/${m.id}`} className="font-medium text-kiln-700 underline">
                      {m.subject}
                    </Link>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
