import type { NavItem } from "@/components/layout/app-shell";
import type { Role } from "@/db/schema/common";

/** The client portal's sections for a role (the firm's page for its admin only). Links only: each page checks again. */
export function portalNav(role: Role | null): NavItem[] {
  return [
    { href: "/portal", label: "Requests & orders" },
    { href: "/portal/requests/new", label: "New request" },
    { href: "/portal/payments", label: "Payments" },
    ...(role === "client_admin" ? [{ href: "/portal/firm", label: "Firm & members" }] : []),
    { href: "/two-factor", label: "Sign-in code" },
  ];
}
