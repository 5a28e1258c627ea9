/** Layerwright's mark: three stacked beads stepping out like a near-net wall, cut flat on one side. */
export function LogoMark({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect x="3" y="21" width="22" height="6" rx="3" fill="#d9692a" />
      <rect x="6" y="13.5" width="20" height="6" rx="3" fill="#e98a4c" />
      <rect x="9" y="6" width="18" height="6" rx="3" fill="#fadfcb" />
      <path d="M27 4v25" stroke="#242b33" strokeWidth="2.4" strokeLinecap="round" />
    </svg>
  );
}

export function Logo({ tone = "dark" }: { tone?: "dark" | "light" }) {
  return (
    <span className="inline-flex items-center gap-2">
      <LogoMark />
      <span className={`text-lg font-semibold tracking-tight ${tone === "dark" ? "text-ink-800" : "text-paper-50"}`}>
        Layerwright
      </span>
    </span>
  );
}
