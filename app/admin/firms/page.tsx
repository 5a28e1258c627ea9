import type { Metadata } from "next";
import { Badge } from "@/components/ui/badge";
import { EmptyState, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { listFirmsForAdmin } from "@/db/queries/firms-admin";
import { pagePermission } from "@/lib/auth/page-guard";
import { formatDate } from "@/lib/dates";

export const metadata: Metadata = { title: "Client firms" };
export const dynamic = "force-dynamic";

const ROLE: Record<string, string> = { client_admin: "lead", client: "engineer" };

/** The bureau's client firms: who is in each, their billing terms, and whether they are active. */
export default async function FirmsPage() {
  await pagePermission("admin:staff", "/admin/firms");
  const firms = await listFirmsForAdmin(getDb());
  return (
    <>
      <PageHeader title="Client firms" subtitle="Each firm's members and roles, billing terms and activity. Firms manage their own members from their portal; a member's account is disabled from Staff." />
      {firms.length === 0 ? <EmptyState title="No client firms yet">Firms appear here when a client signs up.</EmptyState> : null}
      <div className="space-y-4">
        {firms.map((f) => (
          <section key={f.id} aria-labelledby={`firm-${f.id}`} className="rounded-md bg-white p-4 ring-1 ring-paper-200">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h2 id={`firm-${f.id}`} className="text-lg font-semibold text-ink-800">{f.name}</h2>
              <span className="flex flex-wrap gap-2">
                <Badge tone={f.openRequests > 0 ? "ok" : "neutral"}>{f.openRequests > 0 ? `active · ${f.openRequests} open` : "no open requests"}</Badge>
                <Badge>{f.orders} {f.orders === 1 ? "order" : "orders"}</Badge>
              </span>
            </div>
            <dl className="mt-3 grid gap-3 text-sm sm:grid-cols-4">
              <div><dt className="text-xs text-ink-500">Billing contact</dt><dd className="break-words">{f.billingContact || "—"}{f.billingEmail ? <span className="block text-ink-600">{f.billingEmail}</span> : null}</dd></div>
              <div><dt className="text-xs text-ink-500">Standing PO</dt><dd className="break-words">{f.defaultPoNumber || "—"}</dd></div>
              <div><dt className="text-xs text-ink-500">Units</dt><dd>{f.unitsPref === "in" ? "inches and pounds" : "millimetres and kilograms"}</dd></div>
              <div><dt className="text-xs text-ink-500">Client since · last activity</dt><dd>{formatDate(f.createdAt)} · {formatDate(f.lastActivity)}</dd></div>
            </dl>
            <h3 className="mt-4 text-sm font-semibold text-ink-700">Members</h3>
            {f.members.length === 0 ? (
              <p className="text-sm text-ink-500">No members.</p>
            ) : (
              <ul className="mt-1 divide-y divide-paper-200 text-sm">
                {f.members.map((m) => (
                  <li key={m.email} className="flex flex-wrap items-baseline gap-x-3 gap-y-0.5 py-2">
                    <span className="font-medium text-ink-800">{m.name ?? "—"}</span>
                    <span className="break-all text-ink-600">{m.email}</span>
                    <Badge tone={m.role === "client_admin" ? "info" : "neutral"}>{ROLE[m.role] ?? m.role}</Badge>
                    {m.disabledAt ? <Badge tone="warn">disabled</Badge> : null}
                    <span className="text-xs text-ink-500">joined {formatDate(m.joinedAt)}</span>
                  </li>
                ))}
              </ul>
            )}
          </section>
        ))}
      </div>
    </>
  );
}
