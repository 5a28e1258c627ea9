import type { Metadata } from "next";
import Link from "next/link";
import { getDb } from "@/db/client";
import { listPaymentsForOrg } from "@/db/queries/payments";
import { PaymentStateBadge } from "@/components/stage-badge";
import { EmptyState, PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";
import { PAYMENT_KIND_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { formatDate } from "@/lib/dates";

export const metadata: Metadata = { title: "Payments" };
export const dynamic = "force-dynamic";

const day = (d: Date | null) => formatDate(d);

export default async function PaymentsPage() {
  const user = await pagePermission("payment:pay", "/portal/payments");
  const rows = user.orgId ? await listPaymentsForOrg(getDb(), user.orgId, user.role === "client_admin" ? undefined : user.id) : [];
  return (
    <>
      <PageHeader title="Payments" subtitle={user.role === "client_admin" ? "Every deposit and balance of your firm, with receipts." : "Payments on your requests, with receipts."} />
      {rows.length === 0 ? (
        <EmptyState title="No payments yet">Deposits are paid by card when you accept a quote; the balance when the order ships.</EmptyState>
      ) : (
        <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto rounded-md bg-white ring-1 ring-paper-200">
          <table className="min-w-full text-sm">
            <thead className="bg-paper-100 text-left text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="px-4 py-2">Order</th>
                <th className="px-4 py-2">Kind</th>
                <th className="px-4 py-2 text-right">Amount</th>
                <th className="px-4 py-2">Status</th>
                <th className="px-4 py-2">Paid</th>
                <th className="px-4 py-2">Receipt</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-200">
              {rows.map((p) => (
                <tr key={p.id}>
                  <td className="px-4 py-2">
                    <Link href={`/portal/requests/${p.requestId}`} className="whitespace-nowrap font-mono text-kiln-700 underline">
                      {p.reference}
                    </Link>
                    <span className="block text-xs text-ink-500">{p.projectName}</span>
                  </td>
                  <td className="px-4 py-2">{PAYMENT_KIND_LABEL[p.kind]}</td>
                  <td className="figures px-4 py-2 text-right">{formatCents(p.amountCents, p.currency)}</td>
                  <td className="px-4 py-2">
                    <PaymentStateBadge state={p.status} />
                  </td>
                  <td className="whitespace-nowrap px-4 py-2">{day(p.paidAt)}</td>
                  <td className="px-4 py-2">
                    {p.status === "paid" || p.status.includes("refunded") ? (
                      <Link href={`/portal/payments/${p.id}`} className="whitespace-nowrap font-mono text-kiln-700 underline">
                        {p.receiptNumber ?? "View"}
                      </Link>
                    ) : (
                      "—"
                    )}
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
