import { cn } from "./cn";

/** A plain caution or notice box (safety cautions, estimate labels, errors). */
export function Alert({
  tone = "warn",
  title,
  children,
  className,
}: {
  tone?: "warn" | "danger" | "info";
  title: string;
  children?: React.ReactNode;
  className?: string;
}) {
  const styles = {
    warn: "border-amber-300 bg-amber-50 text-amber-900",
    danger: "border-red-300 bg-red-50 text-red-900",
    info: "border-tide-100 bg-tide-50 text-tide-700",
  }[tone];
  return (
    <div role={tone === "danger" ? "alert" : "note"} className={cn("rounded border-l-4 px-4 py-3 text-sm", styles, className)}>
      <p className="font-semibold">{title}</p>
      {children ? <div className="mt-1 space-y-1">{children}</div> : null}
    </div>
  );
}
