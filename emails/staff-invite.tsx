import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface StaffInviteEmailProps {
  role: string;
  invitedBy: string;
  /** The accept page, with the one-time token. */
  url: string;
  /** When the link stops working, as a date. */
  expiresText: string;
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
        {p.invitedBy} has made you a staff account at Ostrevane Additive Works, with the {ROLE_TEXT[p.role] ?? p.role} role.
      </Text>
      <Text style={paragraph}>
        Accept the invitation to set your name and a password. The link works once, until {p.expiresText}; after that, ask
        your bureau&rsquo;s admin for a new one.
      </Text>
      <Button href={p.url} style={buttonStyle}>
        Accept the invitation
      </Button>
      <Text style={paragraph}>You can also sign in with an e-mail link sent to this address.</Text>
    </EmailShell>
  );
}

StaffInviteEmail.PreviewProps = {
  role: "production",
  invitedBy: "Wren Halloway",
  url: "http://localhost:3000/invite/accept?token=preview-token-preview-token-preview-token-0",
  expiresText: "8 December 2026",
} satisfies StaffInviteEmailProps;
