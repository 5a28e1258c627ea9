import type { Metadata } from "next";
import { AuthNotice } from "@/components/auth/auth-notice";

export const metadata: Metadata = { title: "Password changed" };

export default function ResetDonePage() {
  return (
    <AuthNotice title="Password changed" role="status" linkLabel="Sign in">
      Your new password is set. Sign in with it now.
    </AuthNotice>
  );
}
