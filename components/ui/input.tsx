import type { ComponentProps } from "react";
import { cn } from "./cn";

export const inputClass =
  "block w-full rounded border-0 bg-white px-3 py-2 text-base text-ink-800 ring-1 ring-inset ring-paper-300 " +
  "placeholder:text-ink-400 focus:ring-2 focus:ring-inset focus:ring-kiln-500 aria-[invalid=true]:ring-signal-danger";

export function Input({ className, ...props }: ComponentProps<"input">) {
  return <input className={cn(inputClass, className)} {...props} />;
}

export function Select({ className, ...props }: ComponentProps<"select">) {
  return <select className={cn(inputClass, "pr-8", className)} {...props} />;
}

export function Textarea({ className, ...props }: ComponentProps<"textarea">) {
  return <textarea className={cn(inputClass, "min-h-24", className)} {...props} />;
}

export function Label({ className, ...props }: ComponentProps<"label">) {
  return <label className={cn("block text-sm font-medium text-ink-700", className)} {...props} />;
}

/** A labelled field with its error under it. */
export function Field({
  label,
  htmlFor,
  error,
  hint,
  children,
}: {
  label: string;
  htmlFor: string;
  error?: string;
  hint?: string;
  children: React.ReactNode;
}) {
  return (
    <div className="space-y-1">
      <Label htmlFor={htmlFor}>{label}</Label>
      {children}
      {hint && !error ? <p className="text-xs text-ink-400">{hint}</p> : null}
      {error ? (
        <p className="text-xs text-signal-danger" role="alert" id={`${htmlFor}-error`}>
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function FormMessage({ tone = "error", children }: { tone?: "error" | "ok"; children?: React.ReactNode }) {
  if (!children) return null;
  return (
    <p
      role={tone === "error" ? "alert" : "status"}
      className={cn(
        "rounded px-3 py-2 text-sm",
        tone === "error" ? "bg-red-50 text-signal-danger" : "bg-tide-50 text-tide-700",
      )}
    >
      {children}
    </p>
  );
}
