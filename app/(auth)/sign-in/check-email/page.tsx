import { AuthNotice } from "@/components/auth/auth-notice";

export default function CheckEmailPage() {
  return (
    <AuthNotice title="Check your e-mail">
      If an account exists for that address, we have sent it a sign-in link. The link works once and expires in 15 minutes.
    </AuthNotice>
  );
}
