import { cn } from "./cn";

const tones = {
  neutral: "bg-paper-100 text-ink-600 ring-paper-300",
  accent: "bg-kiln-50 text-kiln-700 ring-kiln-100",
  ok: "bg-green-50 text-signal-ok ring-green-200",
  warn: "bg-amber-50 text-signal-warn ring-amber-200",
  danger: "bg-red-50 text-signal-danger ring-red-200",
  info: "bg-tide-50 text-tide-700 ring-tide-100",
} as const;

export type BadgeTone = keyof typeof tones;

export function Badge({ tone = "neutral", children, className }: { tone?: BadgeTone; children: React.ReactNode; className?: string }) {
  return (
    <span className={cn("inline-flex items-center rounded px-1.5 py-0.5 text-xs font-medium ring-1 ring-inset", tones[tone], className)}>
      {children}
    </span>
  );
}
