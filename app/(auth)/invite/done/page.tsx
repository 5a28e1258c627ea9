import type { Metadata } from "next";
import { AuthNotice } from "@/components/auth/auth-notice";

export const metadata: Metadata = { title: "Invitation accepted" };

export default function InvitationDonePage() {
  return (
    <AuthNotice title="You are on the staff" role="status" linkLabel="Sign in">
      Your name and password are set. Sign in with your e-mail address and the new password.
    </AuthNotice>
  );
}
