"use client";

import { useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useEffect } from "react";
import { NavLinks, ROLE_LABELS } from "@/components/layout/app-shell";
import { Alert } from "@/components/ui/alert";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader, Skeleton } from "@/components/ui/card";
import type { PortalMe } from "@/lib/contracts/portal";
import { isStaff } from "@/lib/auth/policy";
import { portalNav } from "@/app/(portal)/portal/_components/portal-nav";
import { RequestsTable } from "@/app/(portal)/portal/_components/requests-table";

/**
 * The portal home is a static page (the same bytes for everyone, served without a render); these
 * parts ask GET /api/portal/me who is signed in and draw for them. Nothing here is a secret: the
 * rows come from the list API, which checks the session itself. A signed-out or refused answer
 * sends the browser where the server-drawn pages would: sign-in, or /admin for staff (which sends
 * those without their second factor on to set it up).
 */
type MeAnswer = { me: PortalMe; go: null } | { me: null; go: string };

function useMe() {
  const answer = useQuery({
    queryKey: ["portal-me"],
    staleTime: 60_000,
    retry: false,
    queryFn: async (): Promise<MeAnswer> => {
      const res = await fetch("/api/portal/me", { headers: { accept: "application/json" } });
      if (res.status === 401) return { me: null, go: `/sign-in?callbackUrl=${encodeURIComponent("/portal")}` };
      // 403: staff who must set up their second factor first
      if (res.status === 403) return { me: null, go: "/admin" };
      if (!res.ok) {
        const body = (await res.json().catch(() => null)) as { error?: { message?: string } } | null;
        throw new Error(body?.error?.message ?? `The server answered ${res.status}.`);
      }
      const me = (await res.json()) as PortalMe;
      return isStaff(me.role) ? { me: null, go: "/admin" } : { me, go: null };
    },
  });
  return { me: answer.data?.me ?? null, go: answer.data?.go ?? null, error: answer.error };
}

/** The header's sections: the firm's page appears for the firm's admin once known. */
export function PortalNav() {
  const { me } = useMe();
  return <NavLinks items={portalNav(me?.role ?? null)} />;
}

/** The header's name or role. */
export function PortalAccount({ part }: { part: "name" | "role" }) {
  const { me } = useMe();
  if (!me) return <span className="inline-block h-3 w-20 animate-pulse rounded bg-ink-700 align-middle" aria-hidden />;
  return part === "name" ? (me.name ?? me.email) : (ROLE_LABELS[me.role] ?? me.role);
}

/** The page itself: heading, then the requests table once the role (which decides its columns) is known. */
export function PortalHome() {
  const { me, go, error } = useMe();
  const router = useRouter();
  useEffect(() => {
    if (go) router.replace(go);
  }, [go, router]);
  const subtitle = me ? (me.role === "client_admin" ? "Every request and order of your firm." : "Your requests and orders.") : <Skeleton className="h-4 w-56" />;
  return (
    <>
      <PageHeader title="Requests & orders" subtitle={subtitle} actions={<ButtonLink href="/portal/requests/new">New request</ButtonLink>} />
      {error ? (
        <Alert tone="danger" title="Your requests could not be loaded.">
          {error.message} Reload the page to try again.
        </Alert>
      ) : me ? (
        <RequestsTable showAuthor={me.role === "client_admin"} />
      ) : (
        <Outline />
      )}
    </>
  );
}

/** The table's outline while the page learns who it is for. */
function Outline() {
  return (
    <div className="space-y-3" role="status" aria-label="Loading your requests">
      <div className="flex flex-col gap-2 sm:flex-row">
        <Skeleton className="h-9 sm:w-72" />
        <Skeleton className="h-9 sm:w-48" />
      </div>
      <div className="space-y-3 rounded-md bg-white p-4 ring-1 ring-paper-200">
        <Skeleton className="h-4 w-1/3" />
        {Array.from({ length: 5 }, (_, i) => (
          <Skeleton key={i} className="h-4 w-full" />
        ))}
      </div>
    </div>
  );
}
