import Link from "next/link";
import { Logo } from "@/components/brand/logo";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="grid min-h-screen md:grid-cols-[1fr_minmax(0,32rem)]">
      <aside className="relative hidden overflow-hidden bg-ink-800 p-10 text-paper-100 md:block">
        <Link href="/">
          <Logo tone="light" />
        </Link>
        <div className="absolute inset-x-10 bottom-10 space-y-3">
          <svg viewBox="0 0 160 96" className="h-24 w-40" aria-hidden="true">
            {Array.from({ length: 6 }, (_, i) => (
              <rect key={i} x={(i % 2) * 4} y={84 - i * 16} width={150 - i * 10} height={12} rx={6} fill="#d9692a" opacity={0.4 + i * 0.1} />
            ))}
          </svg>
          <p className="max-w-md text-lg">Printed near-net, machined to net. Tooling up to 9 metres long, followed from upload to delivery.</p>
        </div>
      </aside>
      <main className="flex items-center justify-center px-5 py-12">
        <div className="w-full max-w-sm">
          <div className="mb-8 md:hidden">
            <Link href="/">
              <Logo />
            </Link>
          </div>
          {children}
        </div>
      </main>
    </div>
  );
}
