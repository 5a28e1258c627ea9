import { Button, Text } from "@react-email/components";
import { buttonStyle, EmailShell, paragraph } from "./_components/shell";

export interface MemberInviteEmailProps {
  firmName: string;
  invitedBy: string;
  role: "client" | "client_admin";
  url: string;
}

export default function MemberInviteEmail(p: MemberInviteEmailProps) {
  return (
    <EmailShell preview={`${p.invitedBy} invited you to ${p.firmName} on Layerwright`} heading={`Join ${p.firmName} on Layerwright`}>
      <Text style={paragraph}>
        {p.invitedBy} added you to {p.firmName}&rsquo;s account with Ostrevane Additive Works
        {p.role === "client_admin" ? " as a lead, who also manages members and billing" : ""}. Sign in with your e-mail address: we send you a
        one-time link.
      </Text>
      <Button href={p.url} style={buttonStyle}>
        Sign in
      </Button>
    </EmailShell>
  );
}

MemberInviteEmail.PreviewProps = {
  firmName: "Caldrith Aerostructures",
  invitedBy: "Rowan Pellow",
  role: "client",
  url: "http://localhost:3000/sign-in",
} satisfies MemberInviteEmailProps;
