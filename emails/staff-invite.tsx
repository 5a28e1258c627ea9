import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface StaffInviteEmailProps {
  role: string;
  invitedBy: string;
  url: string;
}

const ROLE_TEXT: Record<string, string> = {
  sales: "sales (requests, quotes and client messages)",
  production: "production (cell calendars, stages and actuals)",
  accounts: "accounts (payments, reconciliation and refunds)",
  admin: "bureau manager (staff, catalogue, rate card and audit log)",
};

export default function StaffInviteEmail(p: StaffInviteEmailProps) {
  return (
    <EmailShell preview="Your Layerwright staff account is ready" heading="Welcome to the back office">
      <Text style={paragraph}>
        {p.invitedBy} has made you a staff account at Saltgrass Additive Works, with the {ROLE_TEXT[p.role] ?? p.role} role.
      </Text>
      <Text style={paragraph}>Open the sign-in page and ask for an e-mail link with this address; no password is needed.</Text>
      <Button href={p.url} style={buttonStyle}>
        Sign in
      </Button>
    </EmailShell>
  );
}

StaffInviteEmail.PreviewProps = {
  role: "production",
  invitedBy: "Wren Halloway",
  url: "http://localhost:3000/sign-in",
} satisfies StaffInviteEmailProps;
