import type { Metadata } from "next";
import { AuthNotice } from "@/components/auth/auth-notice";

export const metadata: Metadata = { title: "Check your e-mail" };

export default function ResetSentPage() {
  return (
    <AuthNotice title="Check your e-mail">
      If an account exists for that address, we have sent it a link to choose a new password. The link works once and expires in 30
      minutes.
    </AuthNotice>
  );
}
