import type { Metadata } from "next";
import Link from "next/link";
import { Card, PageHeader } from "@/components/ui/card";
import { pagePermission } from "@/lib/auth/page-guard";
import { hasPermission } from "@/lib/auth/policy";

export const metadata: Metadata = { title: "Bureau overview" };

const AREAS = [
  { href: "/admin/sales", title: "Sales", text: "Submitted requests, quotes and messages.", permission: "sales:inbox" },
  { href: "/admin/production", title: "Production", text: "Cell calendars, the stage board and actuals.", permission: "production:board" },
  { href: "/admin/accounts", title: "Accounts", text: "Payments, reconciliation, refunds and the ledger.", permission: "accounts:ledger" },
  { href: "/admin/catalogue", title: "Catalogue", text: "Materials, printing cells and the rate card.", permission: "admin:catalogue" },
  { href: "/admin/staff", title: "Staff", text: "Staff members, roles and controlled-work clearance.", permission: "admin:staff" },
  { href: "/admin/audit", title: "Audit log", text: "Who changed what, and every file download.", permission: "admin:audit" },
  { href: "/admin/outbox", title: "Outbox", text: "Every e-mail the product has sent.", permission: "admin:outbox" },
] as const;

export default async function AdminHomePage() {
  const user = await pagePermission("admin:access", "/admin");
  const areas = AREAS.filter((a) => hasPermission(user, a.permission));
  return (
    <>
      <PageHeader title="Bureau overview" subtitle="Ostrevane Additive Works · one plant, Monday to Friday, two shifts" />
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        {areas.map((a) => (
          <Link key={a.href} href={a.href} className="group">
            <Card className="h-full transition group-hover:ring-kiln-400">
              <h2 className="font-semibold text-ink-800">{a.title}</h2>
              <p className="mt-1 text-sm text-ink-500">{a.text}</p>
            </Card>
          </Link>
        ))}
      </div>
    </>
  );
}
