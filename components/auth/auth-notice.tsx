import Link from "next/link";

/** A one-message page of the sign-in area (link sent, link expired, password set…), with the way to sign in. */
export function AuthNotice({ title, children, role, linkLabel = "Back to sign in" }: { title: string; children: React.ReactNode; role?: "alert" | "status"; linkLabel?: string }) {
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">{title}</h1>
      <p className="mt-3 text-ink-600" role={role}>
        {children}
      </p>
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="font-medium text-kiln-700 underline">
          {linkLabel}
        </Link>
      </p>
    </>
  );
}
