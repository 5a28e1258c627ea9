import { AppShell, ROLE_LABELS, type NavItem } from "@/components/layout/app-shell";
import { signOutAction } from "@/app/(auth)/actions";
import { pagePermission } from "@/lib/auth/page-guard";
import { hasPermission, type Permission } from "@/lib/auth/policy";

/** Staff sections, each shown only to the roles that may open it (the pages check again). */
const SECTIONS: { href: string; label: string; permission: Permission }[] = [
  { href: "/admin", label: "Overview", permission: "admin:access" },
  { href: "/admin/sales", label: "Sales", permission: "sales:inbox" },
  { href: "/admin/production", label: "Production", permission: "production:board" },
  { href: "/admin/accounts", label: "Accounts", permission: "accounts:ledger" },
  { href: "/admin/catalogue", label: "Catalogue", permission: "admin:catalogue" },
  { href: "/admin/staff", label: "Staff", permission: "admin:staff" },
  { href: "/admin/firms", label: "Client firms", permission: "admin:staff" },
  { href: "/admin/audit", label: "Audit log", permission: "admin:audit" },
  { href: "/admin/outbox", label: "Outbox", permission: "admin:outbox" },
];

export default async function AdminLayout({ children }: { children: React.ReactNode }) {
  const user = await pagePermission("admin:access", "/admin");
  const nav: NavItem[] = SECTIONS.filter((s) => hasPermission(user, s.permission)).map(({ href, label }) => ({ href, label }));
  nav.push({ href: "/two-factor", label: "Sign-in code" });
  return (
    <AppShell nav={nav} area="Bureau" userLabel={user.name ?? user.email} roleLabel={ROLE_LABELS[user.role] ?? user.role} signOutAction={signOutAction}>
      {children}
    </AppShell>
  );
}
