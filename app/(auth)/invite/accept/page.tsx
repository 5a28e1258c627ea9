import type { Metadata } from "next";
import { AcceptInvitationForm } from "@/app/(auth)/invite/accept/_components/accept-invitation-form";
import { AuthNotice } from "@/components/auth/auth-notice";
import { getDb } from "@/db/client";
import { openInvitation } from "@/lib/auth/staff-invitation";
import { INVITE_TOKEN } from "@/lib/validation/staff-invitation";

export const metadata: Metadata = { title: "Accept your invitation", referrer: "no-referrer" };
export const dynamic = "force-dynamic";

const ROLE_TEXT: Record<string, string> = { sales: "sales", production: "production", accounts: "accounts", admin: "bureau manager (admin)" };

/** The staff invitation's landing page: the link's token is checked before the form shows. */
export default async function AcceptInvitationPage({ searchParams }: { searchParams: Promise<{ token?: string | string[] }> }) {
  const { token } = await searchParams;
  const value = typeof token === "string" && INVITE_TOKEN.test(token) ? token : null;
  const invitation = value ? await openInvitation(getDb(), value, new Date()) : null;
  if (!value || !invitation) {
    return (
      <AuthNotice title="This invitation no longer works" role="alert">
        The link has expired or has already been used. Ask your bureau&rsquo;s admin to invite you again; if you have already set
        your password, sign in with it.
      </AuthNotice>
    );
  }
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Join the back office</h1>
      <p className="mb-6 mt-1 text-sm text-ink-500">
        You are invited to Ostrevane Additive Works with the {ROLE_TEXT[invitation.role] ?? invitation.role} role. Set your name and a
        password; the link works once.
      </p>
      <AcceptInvitationForm token={value} email={invitation.email} />
    </>
  );
}
