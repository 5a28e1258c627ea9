import type { Metadata } from "next";
import { signOutAction } from "@/app/(auth)/actions";
import { PortalAccount, PortalHome, PortalNav } from "@/app/(portal)/portal/_components/portal-home";
import { AppShell } from "@/components/layout/app-shell";
import { QueryProvider } from "@/components/portal/query-provider";

export const metadata: Metadata = { title: "Requests & orders" };
// Built once: a render per visit cost 6–18 ms of server CPU for a page whose rows come from the
// list API anyway. `error` makes the build fail if anything here starts reading the request.
export const dynamic = "error";

/**
 * The client home, one static page for every client (the rest of the portal is drawn per request
 * under (member)/layout.tsx). The proxy sends the signed-out to sign-in; the parts that name the
 * user, and the table, load from the APIs, which check the session on every call.
 */
export default function PortalHomePage() {
  return (
    <QueryProvider>
      <AppShell nav={<PortalNav />} area="Client portal" userLabel={<PortalAccount part="name" />} roleLabel={<PortalAccount part="role" />} signOutAction={signOutAction}>
        <PortalHome />
      </AppShell>
    </QueryProvider>
  );
}
