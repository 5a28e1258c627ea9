import Link from "next/link";
import { LogoMark } from "@/components/brand/logo";

export interface NavItem {
  href: string;
  label: string;
}

/** The signed-in frame: a top bar with the sections this user may open, and the page below. */
export function AppShell({
  nav,
  area,
  userLabel,
  roleLabel,
  signOutAction,
  children,
}: {
  /** The sections, or an element drawing them (a static page's, filled in the browser). */
  nav: NavItem[] | React.ReactElement;
  area: string;
  userLabel: React.ReactNode;
  roleLabel: React.ReactNode;
  /** The route's sign-out action (a server action, passed down: nothing under components/ imports from app/). */
  signOutAction: (formData: FormData) => Promise<void>;
  children: React.ReactNode;
}) {
  return (
    <div className="min-h-screen">
      <header className="border-b border-ink-700 bg-ink-800 text-paper-100">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3 sm:px-6">
          <Link href="/" className="flex items-center gap-2 font-semibold">
            <LogoMark className="h-6 w-6" />
            <span>Layerwright</span>
            <span className="rounded bg-ink-700 px-1.5 py-0.5 text-xs font-normal text-paper-300">{area}</span>
          </Link>
          <nav aria-label="Sections" className="order-3 -mx-1 flex w-full flex-wrap gap-1 sm:order-none sm:w-auto">
            {Array.isArray(nav) ? <NavLinks items={nav} /> : nav}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="hidden text-right leading-tight sm:block">
              <span className="block">{userLabel}</span>
              <span className="block text-xs text-paper-300">{roleLabel}</span>
            </span>
            <form action={signOutAction}>
              <button type="submit" className="rounded px-2 py-1 text-paper-200 ring-1 ring-ink-600 hover:bg-ink-700">
                Sign out
              </button>
            </form>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-7xl px-4 py-8 sm:px-6">{children}</main>
    </div>
  );
}

/** The top bar's section links. */
export function NavLinks({ items }: { items: NavItem[] }) {
  return items.map((item) => (
    <Link key={item.href} href={item.href} className="whitespace-nowrap rounded px-2 py-1 text-sm text-paper-200 hover:bg-ink-700 hover:text-white">
      {item.label}
    </Link>
  ));
}

export const ROLE_LABELS: Record<string, string> = {
  client: "Client engineer",
  client_admin: "Client lead",
  sales: "Sales engineer",
  production: "Production planner",
  accounts: "Accounts",
  admin: "Bureau manager",
};
