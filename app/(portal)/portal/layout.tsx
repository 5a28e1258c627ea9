import { redirect } from "next/navigation";
import { AppShell, ROLE_LABELS, type NavItem } from "@/components/layout/app-shell";
import { signOutAction } from "@/app/(auth)/actions";
import { QueryProvider } from "@/components/portal/query-provider";
import { pageUser } from "@/lib/auth/page-guard";
import { isStaff } from "@/lib/auth/policy";

export default async function PortalLayout({ children }: { children: React.ReactNode }) {
  const user = await pageUser("/portal");
  if (isStaff(user.role)) redirect("/admin");
  const nav: NavItem[] = [
    { href: "/portal", label: "Requests & orders" },
    { href: "/portal/requests/new", label: "New request" },
    { href: "/portal/payments", label: "Payments" },
  ];
  if (user.role === "client_admin") {
    nav.push({ href: "/portal/firm", label: "Firm & members" });
  }
  nav.push({ href: "/two-factor", label: "Sign-in code" });
  return (
    <AppShell nav={nav} area="Client portal" userLabel={user.name ?? user.email} roleLabel={ROLE_LABELS[user.role] ?? user.role} signOutAction={signOutAction}>
      <QueryProvider>{children}</QueryProvider>
    </AppShell>
  );
}
