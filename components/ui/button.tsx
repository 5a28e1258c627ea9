import Link from "next/link";
import type { ComponentProps } from "react";
import { cn } from "./cn";

const variants = {
  primary: "bg-kiln-600 text-white hover:bg-kiln-700 focus-visible:outline-kiln-600",
  // The outline keeps 3:1 against white and paper (WCAG 1.4.11), so a secondary button never vanishes into its card.
  secondary: "bg-white text-ink-700 ring-1 ring-inset ring-ink-400 hover:bg-paper-100 focus-visible:outline-ink-600",
  ghost: "text-ink-600 hover:bg-paper-100 focus-visible:outline-ink-600",
  danger: "bg-signal-danger text-white hover:opacity-90 focus-visible:outline-signal-danger",
} as const;
const sizes = { sm: "h-8 px-3 text-sm", md: "h-10 px-4 text-sm", lg: "h-12 px-6 text-base" } as const;

export type ButtonVariant = keyof typeof variants;

export function buttonClass(variant: ButtonVariant = "primary", size: keyof typeof sizes = "md", extra?: string) {
  return cn(
    "inline-flex items-center justify-center gap-2 rounded font-medium transition-colors",
    "focus-visible:outline-2 focus-visible:outline-offset-2 disabled:cursor-not-allowed disabled:opacity-50",
    variants[variant],
    sizes[size],
    extra,
  );
}

export function Button({
  variant = "primary",
  size = "md",
  className,
  ...props
}: ComponentProps<"button"> & { variant?: ButtonVariant; size?: keyof typeof sizes }) {
  return <button className={buttonClass(variant, size, className)} {...props} />;
}

export function ButtonLink({
  variant = "primary",
  size = "md",
  className,
  ...props
}: ComponentProps<typeof Link> & { variant?: ButtonVariant; size?: keyof typeof sizes }) {
  return <Link className={buttonClass(variant, size, className)} {...props} />;
}
