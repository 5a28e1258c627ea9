import type { Metadata } from "next";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { pageUser } from "@/lib/auth/page-guard";
import { RequestsSlot } from "@/app/(portal)/portal/_components/requests-slot";

export const metadata: Metadata = { title: "Requests & orders" };

export default async function PortalHomePage() {
  const user = await pageUser("/portal");
  return (
    <>
      <PageHeader
        title="Requests & orders"
        subtitle={user.role === "client_admin" ? "Every request and order of your firm." : "Your requests and orders."}
        actions={<ButtonLink href="/portal/requests/new">New request</ButtonLink>}
      />
      <RequestsSlot showAuthor={user.role === "client_admin"} />
    </>
  );
}
