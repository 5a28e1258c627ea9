import { notFound } from "next/navigation";
import { getDb } from "@/db/client";
import { getOutboxMessage } from "@/db/queries/outbox";
import { Card, PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";

export const dynamic = "force-dynamic";

export default async function OutboxMessagePage({ params }: { params: Promise<{ id: string }> }) {
  await pagePermission("admin:outbox", "/admin/outbox");
  const { id } = await params;
  const message = await getOutboxMessage(getDb(), id);
  if (!message) notFound();
  return (
    <>
      <PageHeader title={message.subject} subtitle={`From ${message.fromAddress} to ${message.toAddresses.join(", ")}`} />
      <Card className="p-0">
        {/* The message is shown in a sandboxed frame: no scripts, no access to this page. */}
        {/* E-mails are laid out 600 px wide: on a phone the preview scrolls inside its own frame, never clipped. */}
        <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto rounded-md">
          <iframe title="Rendered e-mail" sandbox="" srcDoc={message.html ?? `<pre>${message.text ?? ""}</pre>`} className="h-[70vh] w-full min-w-[640px] rounded-md" />
        </div>
      </Card>
    </>
  );
}
