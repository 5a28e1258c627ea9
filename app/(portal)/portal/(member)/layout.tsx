import { redirect } from "next/navigation";
import { AppShell, ROLE_LABELS } from "@/components/layout/app-shell";
import { portalNav } from "@/app/(portal)/portal/_components/portal-nav";
import { signOutAction } from "@/app/(auth)/actions";
import { QueryProvider } from "@/components/portal/query-provider";
import { pageUser } from "@/lib/auth/page-guard";
import { isStaff } from "@/lib/auth/policy";

/** Every portal page but the home page (static: app/(portal)/portal/page.tsx): the signed-in frame, drawn on the server. */
export default async function PortalLayout({ children }: { children: React.ReactNode }) {
  const user = await pageUser("/portal");
  if (isStaff(user.role)) redirect("/admin");
  const nav = portalNav(user.role);
  return (
    <AppShell nav={nav} area="Client portal" userLabel={user.name ?? user.email} roleLabel={ROLE_LABELS[user.role] ?? user.role} signOutAction={signOutAction}>
      <QueryProvider>{children}</QueryProvider>
    </AppShell>
  );
}
